import type { Role } from '../lib/roles';

/**
 * Demo sign-ins created by the seed on a fresh database (one per role). For the local demo and the
 * tests only: the start script prints them; a real deployment invites people instead.
 */
export const DEMO_PASSWORD = 'lossline-demo-1';
export const DEMO_ACCOUNTS: readonly { email: string; name: string; role: Role }[] = [
  { email: 'admin@demo.lossline.test', name: 'Ada Admin', role: 'admin' },
  { email: 'lead@demo.lossline.test', name: 'Lena Lead', role: 'energy-lead' },
  { email: 'operator@demo.lossline.test', name: 'Omar Operator', role: 'operator' },
  { email: 'planner@demo.lossline.test', name: 'Pia Planner', role: 'planner' },
];
