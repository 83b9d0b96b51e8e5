/** The five roles of DESIGN §1, from field crew to deployment admin. */
export const ROLES = ['sampler', 'geologist', 'lab', 'manager', 'admin'] as const;

/** One of the roles a user holds; each user holds exactly one. */
export type Role = (typeof ROLES)[number];

/** True when the value names a role. */
export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
