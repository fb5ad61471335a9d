import { z } from 'zod';
import { text } from './text';
import { ROLES } from '$lib/roles';

const email = text('Enter an e-mail address.')
	.trim()
	.toLowerCase()
	.pipe(z.email('Enter a complete e-mail address, like name@example.org.'));

/** The admin's members table: search, filters, sorting and paging, as sent to the API. */
export const memberQuerySchema = z.object({
	q: text().trim().max(120, 'Keep the search under 120 characters.').optional().default(''),
	role: z.enum(ROLES, 'Unknown role.').optional(),
	standing: z.enum(['current', 'lapsed', 'none'], 'Unknown standing.').optional(),
	sort: z
		.enum(['name', 'email', 'duesPaidThrough', 'joinedOn'], 'Unknown column to sort by.')
		.optional()
		.default('name'),
	dir: z.enum(['asc', 'desc'], 'Sort up (asc) or down (desc).').optional().default('asc'),
	page: z.coerce.number().int().min(1).max(10_000).optional().default(1),
	pageSize: z.coerce.number().int().min(5).max(200).optional().default(25)
});

export type MemberQuery = z.infer<typeof memberQuerySchema>;

/** The members table's query from a page or API address (empty filters count as none). */
export function parseMemberQuery(searchParams: URLSearchParams) {
	const params = Object.fromEntries(searchParams);
	return memberQuerySchema.safeParse({
		...params,
		role: params.role || undefined,
		standing: params.standing || undefined
	});
}

/** Form: invite an address into the society with some roles. */
export const inviteSchema = z.object({
	societyId: z.uuid('Choose a society.'),
	email,
	name: text().trim().max(120, 'Keep the name under 120 characters.').optional().default(''),
	roles: z.array(z.enum(ROLES, 'Unknown role.')).max(ROLES.length)
});

/** Form: set a member's roles; taking a role away needs confirm=yes. */
export const changeRolesSchema = z.object({
	societyId: z.uuid('Choose a society.'),
	userId: z.uuid('Choose a person from the table.'),
	roles: z.array(z.enum(ROLES, 'Unknown role.')).max(ROLES.length),
	confirm: z
		.enum(['yes', ''])
		.optional()
		.default('')
		.transform((v) => v === 'yes')
});
