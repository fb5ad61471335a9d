/** The roles a person can hold in a society. */
export const ROLES = ['admin', 'chair', 'clerk', 'judge', 'member'] as const;

export type Role = (typeof ROLES)[number];

/** Plain names of the roles, as people in a society call them. */
export const ROLE_LABELS: Record<Role, string> = {
	admin: 'Society admin',
	chair: 'Show chair',
	clerk: 'Clerk',
	judge: 'Judge',
	member: 'Member'
};

/** The start page of each role. */
export const ROLE_HOMES: Record<Role, string> = {
	admin: '/admin',
	chair: '/chair',
	clerk: '/desk',
	judge: '/judging',
	member: '/my'
};

/** True when the value names a known role. */
export function isRole(value: unknown): value is Role {
	return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
