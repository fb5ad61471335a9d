import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { DEFAULT_SOCIETY_SETTINGS } from '$lib/domain/society-settings';
import { societyFormOptions, societyFormValues, startSocietySchema } from '$lib/schemas/society';
import { societySignup } from '$lib/server/config';
import { sequelize } from '$lib/server/db';
import { requireUser } from '$lib/server/policies';
import { SIGNUP_CLOSED_MESSAGE, startSociety } from '$lib/server/people/societies';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	const d = DEFAULT_SOCIETY_SETTINGS;
	return {
		open: societySignup() === 'open',
		closedMessage: SIGNUP_CLOSED_MESSAGE,
		options: societyFormOptions(),
		defaults: {
			country: d.country,
			unit: d.lengthUnit,
			paperSize: d.paperSize,
			timeZone: d.timeZone,
			currency: d.currency
		}
	};
};

const text = (v: unknown) => (typeof v === 'string' ? v.slice(0, 200) : '');

export const actions: Actions = {
	default: async (event) => {
		const user = requireUser(event);
		const raw = societyFormValues(await event.request.formData());
		const values = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, text(v)]));
		const parsed = startSocietySchema.safeParse(raw);
		if (!parsed.success) {
			const errors = z.flattenError(parsed.error).fieldErrors;
			return fail(400, { message: 'Check the highlighted fields.', errors, values });
		}
		try {
			const started = await sequelize.transaction((transaction) =>
				startSociety(
					{ ...parsed.data, founder: { userId: user.id } },
					{ transaction, startedBy: 'person' }
				)
			);
			redirect(303, `/admin/members?society=${started.society.slug}`);
		} catch (err) {
			return refusedForm(err, (r) => ({
				errors: r.field ? { [r.field]: [r.message] } : {},
				values
			}));
		}
	}
};
