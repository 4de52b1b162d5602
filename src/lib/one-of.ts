/**
 * Whether a value is one of a closed list of names (unit kinds, roles, hour states, error codes ...),
 * as a type guard for the list's type. Each list keeps its own named guard (isUnitKind, isRole ...),
 * written with this one.
 */
export function isOneOf<T extends string>(list: readonly T[], value: unknown): value is T {
  return typeof value === 'string' && (list as readonly string[]).includes(value);
}
