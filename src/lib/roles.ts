import { isOneOf } from './one-of';

/** The four roles of Lossline (docs/design.md, "People and what they may do"). */
export const ROLES = ['admin', 'energy-lead', 'operator', 'planner'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  'energy-lead': 'Energy lead',
  operator: 'Operator',
  planner: 'Maintenance planner',
};

export function isRole(value: unknown): value is Role {
  return isOneOf(ROLES, value);
}

/** Every role; for endpoints any signed-in person may call. */
export const ANY_ROLE: readonly Role[] = ROLES;
