import { z } from 'zod';
import { text } from './text';
import { ROLES } from '$lib/roles';

/** Form: give a person (by e-mail) a set of roles in a society. */
export const setRolesSchema = z.object({
	societyId: z.uuid('Choose a society.'),
	email: text()
		.trim()
		.toLowerCase()
		.min(1, 'Enter an e-mail address.')
		.max(254, 'That address is too long.')
		.pipe(z.email('Enter a complete e-mail address, like name@example.org.')),
	name: text().trim().max(120, 'Keep the name under 120 characters.').optional().default(''),
	roles: z.array(z.enum(ROLES, 'Unknown role.')).max(ROLES.length)
});
