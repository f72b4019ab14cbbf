/** Roles on a property, from least to most trusted (DESIGN.md, "The people and their job"). */
export const ROLES = ['viewer', 'crew', 'manager', 'owner'] as const;
export type Role = (typeof ROLES)[number];

/** True when `role` carries at least the rights of `minimum`. */
export function hasRole(role: Role, minimum: Role): boolean {
  return ROLES.indexOf(role) >= ROLES.indexOf(minimum);
}

/** What each role may do, in the words shown on the members page. */
export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  owner: 'Everything a manager can do, plus changing roles and removing members.',
  manager: 'Draws fence lines, uploads elevation models and tracks, approves designs, sets prices, sends work to crews, records rain events.',
  crew: 'Sees the work orders given to them with positions and materials, marks work done, records flood inspections.',
  viewer: 'Reads plans, maps, costs and inspection history.',
};
