import { fail } from '@sveltejs/kit';
import { mailPreferencesSchema } from '$lib/schemas/plants';
import { sequelize } from '$lib/server/db';
import { requireRole } from '$lib/server/policies';
import { getMailPreferences, setMailPreferences } from '$lib/server/people/mail-preferences';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['member']);
	return { preferences: await getMailPreferences(user.id) };
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireRole(event, ['member']);
		const form = await event.request.formData();
		// A ticked box sends 'on', an unticked one nothing: anything else is not this form.
		for (const name of ['reminders', 'results']) {
			const values = form.getAll(name);
			if (values.length > 1 || (values.length === 1 && values[0] !== 'on'))
				return fail(400, { message: 'Tick or untick the boxes and save again.' });
		}
		const preferences = mailPreferencesSchema.parse({
			reminders: form.get('reminders') === 'on',
			results: form.get('results') === 'on'
		});
		await sequelize.transaction((transaction) =>
			setMailPreferences(user.id, preferences, { transaction })
		);
		return { saved: true };
	}
};
