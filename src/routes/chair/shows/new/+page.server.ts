import { fail, redirect } from '@sveltejs/kit';
import type { z } from 'zod';
import { copyShowSchema, newShowSchema } from '$lib/schemas/show-setup';
import { sequelize } from '$lib/server/db';
import { textFields } from '$lib/server/http/forms';
import { requireRole } from '$lib/server/policies';
import {
	chairSocieties,
	copyShow,
	createShow,
	listCopySources,
	type SetupActor
} from '$lib/server/shows/show-setup';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

const NEW_FIELDS = [
	'societyId',
	'name',
	'slug',
	'venue',
	'entriesOpen',
	'entriesClose',
	'entryDay',
	'judgingDay',
	'awardSystem',
	'panelScoreMethod'
] as const;
const COPY_FIELDS = [...NEW_FIELDS.slice(0, 8), 'sourceShowId'] as const;

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['chair']);
	return { societies: chairSocieties(user), sources: await listCopySources(user) };
};

/** Parses the form, runs the set-up in one transaction and opens the new show's page. */
async function setUp<S extends z.ZodType>(
	kind: 'create' | 'copy',
	form: FormData,
	fields: readonly string[],
	schema: S,
	work: (
		input: z.infer<S>,
		transaction: import('sequelize').Transaction
	) => Promise<{ slug: string }>
) {
	const values = textFields(form, fields);
	const parsed = schema.safeParse(values);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		const field = String(issue.path[0] ?? 'form');
		return fail(400, { kind, message: issue.message, field, values });
	}
	let slug: string;
	try {
		slug = (await sequelize.transaction((t) => work(parsed.data, t))).slug;
	} catch (err) {
		return refusedForm(err, (r) => ({ kind, field: r.field ?? 'form', values }));
	}
	redirect(303, `/chair/shows/${slug}?started=${kind}`);
}

export const actions: Actions = {
	create: async (event) => {
		const user: SetupActor = requireRole(event, ['chair']);
		const form = await event.request.formData();
		return setUp('create', form, NEW_FIELDS, newShowSchema, (input, transaction) =>
			createShow(user, input, { transaction })
		);
	},
	copy: async (event) => {
		const user: SetupActor = requireRole(event, ['chair']);
		const form = await event.request.formData();
		return setUp('copy', form, COPY_FIELDS, copyShowSchema, (input, transaction) =>
			copyShow(user, input, { transaction })
		);
	}
};
