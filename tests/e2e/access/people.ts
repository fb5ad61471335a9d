/** The people the access table checks, one per kind of visitor (addresses from the demo seed). */
export const VISITORS = {
	anon: null,
	other: 'other-admin@crownbench.test', // admin and chair of another society
	member: 'member@crownbench.test',
	clerk: 'clerk@crownbench.test',
	judge: 'judge1@crownbench.test',
	chair: 'chair@crownbench.test',
	admin: 'admin@crownbench.test'
} as const;

export type Visitor = keyof typeof VISITORS;
export const VISITOR_KINDS = Object.keys(VISITORS) as Visitor[];
