import type { Role } from './roles';

/**
 * The navigation, with the roles each entry is shown to. Only pages that exist are listed: a
 * capability not built yet has no entry. Must agree with src/server/policy.ts (a test checks it).
 */
export interface NavItem {
  href: string;
  label: string;
  roles: readonly Role[];
}

export const NAV: readonly NavItem[] = [
  { href: '/', label: 'Overview', roles: ['admin', 'energy-lead', 'operator', 'planner'] },
  // --- ingest ---
  { href: '/uploads', label: 'Uploads', roles: ['admin', 'energy-lead', 'operator'] },
  // --- plant model ---
  { href: '/plant', label: 'Plant model', roles: ['admin', 'energy-lead', 'operator', 'planner'] },
  // --- engine ---
  { href: '/units', label: 'Unit results', roles: ['admin', 'energy-lead', 'operator', 'planner'] },
  // --- baselines and drift ---
  { href: '/baselines', label: 'Baselines', roles: ['admin', 'energy-lead', 'operator', 'planner'] },
  { href: '/notices', label: 'Drift notices', roles: ['admin', 'energy-lead', 'operator', 'planner'] },
  // --- trends, ledger, reports ---
  { href: '/trends', label: 'Trends', roles: ['admin', 'energy-lead', 'operator', 'planner'] },
  { href: '/ledger', label: 'Loss ledger', roles: ['admin', 'energy-lead', 'operator', 'planner'] },
  { href: '/reports', label: 'Reports', roles: ['admin', 'energy-lead'] },
  { href: '/admin/users', label: 'People', roles: ['admin'] },
  { href: '/admin/tokens', label: 'API tokens', roles: ['admin'] },
];

export function navFor(role: Role): NavItem[] {
  return NAV.filter((n) => n.roles.includes(role));
}
