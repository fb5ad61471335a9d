import { error, fail, redirect } from '@sveltejs/kit';
import { checkInSchema, moveSchema, scratchSchema } from '$lib/schemas/desk';
import { sequelize } from '$lib/server/db';
import { requireConfirmation } from '$lib/server/http/confirm';
import { fieldErrors, textFields } from '$lib/server/http/forms';
import { requireShowRole } from '$lib/server/shows/policies';
import { checkInEntry, loadDeskEntry, moveEntry, scratchEntry } from '$lib/server/entries/desk';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

const ROLES = ['clerk', 'chair'] as const;

async function deskEntry(event: Parameters<PageServerLoad>[0] | Parameters<Actions[string]>[0]) {
	const { show, user } = await requireShowRole(event, event.params.slug!, ROLES);
	const number = /^\d{1,9}$/.test(event.params.number ?? '') ? Number(event.params.number) : NaN;
	const entry = Number.isNaN(number) ? null : await loadDeskEntry(show, number);
	if (!entry) error(404, `There is no entry ${event.params.number} in this show.`);
	return { show, user, entry };
}

/** Runs a desk change in one transaction; a DeskProblem becomes a 400 with its sentence. */
async function attempt(change: (t: import('sequelize').Transaction) => Promise<unknown>) {
	try {
		await sequelize.transaction(change);
		return null;
	} catch (e) {
		return refusedForm(e);
		throw e;
	}
}

export const load: PageServerLoad = async (event) => {
	const { show, entry } = await deskEntry(event);
	const settings = await loadSocietySettings(show.societyId);
	const renumbered = event.url.searchParams.get('renumbered');
	return {
		show: { name: show.name, slug: show.slug },
		entry,
		lengthUnit: settings.lengthUnit,
		entered: event.url.searchParams.get('entered') === '1',
		renumbered: renumbered && /^\d{1,9}$/.test(renumbered) ? Number(renumbered) : null
	};
};

export const actions: Actions = {
	checkIn: async (event) => {
		const { show, user, entry } = await deskEntry(event);
		const values = textFields(await event.request.formData(), [
			'diameter',
			'leaf',
			'crowns',
			'potSize',
			'unit'
		]);
		const parsed = checkInSchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, {
				message: 'Check the measurements; nothing was saved.',
				errors: fieldErrors(parsed.error),
				values
			});
		}
		let number = entry.number;
		const failed = await attempt(async (t) => {
			number = await checkInEntry(show, entry.id, user.id, parsed.data, { transaction: t });
		});
		if (failed) return failed;
		// The first check-in after entries closed fixes the numbers: the entry's page moves with it.
		if (number !== entry.number)
			redirect(303, `/desk/${show.slug}/entries/${number}?renumbered=${entry.number}`);
		return { saved: `Entry ${entry.number} is checked in.` };
	},
	arrived: async (event) => {
		const { show, user, entry } = await deskEntry(event);
		let number = entry.number;
		const failed = await attempt(async (t) => {
			number = await checkInEntry(show, entry.id, user.id, null, { transaction: t });
		});
		if (failed) return failed;
		if (number !== entry.number)
			redirect(303, `/desk/${show.slug}/entries/${number}?renumbered=${entry.number}`);
		return { saved: `Entry ${entry.number} is checked in; measure it when you can.` };
	},
	move: async (event) => {
		const { show, user, entry } = await deskEntry(event);
		const form = await event.request.formData();
		const parsed = moveSchema.safeParse({ classId: form.get('classId') });
		if (!parsed.success) return fail(400, { message: 'Choose one of the proposed classes.' });
		const unconfirmed = requireConfirmation(
			event,
			form,
			`Move entry ${entry.number} to another class?`
		);
		if (unconfirmed) return unconfirmed;
		let label = '';
		let number = entry.number;
		const failed = await attempt(async (t) => {
			const moved = await moveEntry(show, entry.id, parsed.data.classId, {
				transaction: t,
				actor: user
			});
			label = `${moved.target.code} ${moved.target.name}`;
			number = moved.number;
		});
		if (failed) return failed;
		if (number !== entry.number)
			redirect(303, `/desk/${show.slug}/entries/${number}?renumbered=${entry.number}`);
		return { saved: `Entry ${entry.number} is moved to class ${label}.` };
	},
	scratch: async (event) => {
		const { show, user, entry } = await deskEntry(event);
		const form = await event.request.formData();
		const parsed = scratchSchema.safeParse({ reason: form.get('reason') ?? '' });
		if (!parsed.success) {
			return fail(400, {
				message: 'Say briefly why the entry is scratched.',
				errors: fieldErrors(parsed.error)
			});
		}
		const unconfirmed = requireConfirmation(event, form, `Scratch entry ${entry.number}?`);
		if (unconfirmed) return unconfirmed;
		const failed = await attempt((t) =>
			scratchEntry(show, entry.id, parsed.data.reason, { transaction: t, actor: user })
		);
		return failed ?? { saved: `Entry ${entry.number} is scratched.` };
	}
};
