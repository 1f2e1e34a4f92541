/** Brimwatch's roles, lowest first: each role may do everything the ones before it may. */
export const ROLES = ['viewer', 'responder', 'owner', 'sre', 'admin'] as const;

export type Role = (typeof ROLES)[number];

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

/** True when `role` is `floor` or higher in the order above. */
export function atLeast(role: Role, floor: Role): boolean {
  return ROLES.indexOf(role) >= ROLES.indexOf(floor);
}

/** The lower of two roles: a token never carries more than its creator holds now. */
export function lowerOf(a: Role, b: Role): Role {
  return atLeast(a, b) ? b : a;
}

export const roleList = ROLES.join(', ');
