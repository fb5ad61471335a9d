import { error, fail, type RequestEvent } from '@sveltejs/kit';
import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { addCalendarDays, compareIsoDates, isIsoDate, todayIn } from '$lib/domain/dates';
import { lengthField, photoSchema, plantEventSchema, potSuckerSchema } from '$lib/schemas/plants';
import { requireConfirmation } from '$lib/server/http/confirm';
import { sequelize } from '$lib/server/db';
import { fieldErrors, memberAndId } from '$lib/server/plants/plant-route';
import { addPlantPhoto, deletePlantPhoto } from '$lib/server/plants/plant-photos';
import {
	PlantInputError,
	addPlantEvent,
	deletePlantEvent,
	getPlant,
	potUpSucker,
	setPlantGone
} from '$lib/server/plants/plants';
import { loadPlantHistory } from '$lib/server/results/my-results';
import { loadMemberSettings } from '$lib/server/people/society-today';
import { readOnePhoto } from '$lib/server/http/uploads';
import type { Actions, PageServerLoad } from './$types';
import { fieldErrorOf, refusedForm } from '$lib/server/http/refusals';
import { isRefusal } from '$lib/server/http/refusal';

export const load: PageServerLoad = async (event) => {
	const { user, id } = memberAndId(event, event.params.plantId);
	const [plant, settings, history] = await Promise.all([
		getPlant(user.id, id),
		loadMemberSettings(user),
		loadPlantHistory(user.id, id)
	]);
	if (!plant) error(404, 'This plant does not exist.');
	return { plant, history, today: todayIn(settings.timeZone), lengthUnit: settings.lengthUnit };
};

type Write = (ownerId: string, plantId: string, transaction: Transaction) => Promise<string>;

/** Runs one write of this page in a transaction; bad input becomes fail(400) for that form. */
async function write(event: RequestEvent, action: string, run: Write) {
	const { user, id } = memberAndId(event, event.params.plantId);
	try {
		const done = await sequelize.transaction((transaction) => run(user.id, id, transaction));
		return { action, done };
	} catch (err) {
		if (isRefusal(err) && err.field === 'plant') error(404, err.message);
		return refusedForm(err, (r) => ({ action, errors: fieldErrorOf(r) }));
	}
}

function invalid(action: string, issues: z.ZodError) {
	return fail(400, {
		action,
		message: 'Check the highlighted fields.',
		errors: fieldErrors(issues)
	});
}

const idField = z.object({ id: z.uuid() });

export const actions: Actions = {
	log: async (event) => {
		const form = await event.request.formData();
		const parsed = plantEventSchema.safeParse({
			kind: form.get('kind') ?? '',
			happenedOn: form.get('happenedOn') ?? '',
			diameter: lengthField(form, 'diameter'),
			crowns: form.get('crowns') ?? '',
			potSize: lengthField(form, 'potSize'),
			note: form.get('note') ?? ''
		});
		const action = String(form.get('form') ?? 'log');
		if (!parsed.success) return invalid(action, parsed.error);
		return write(event, action, async (owner, plantId, transaction) => {
			await addPlantEvent(owner, plantId, parsed.data, { transaction });
			return 'Logged.';
		});
	},
	deleteEvent: async (event) => {
		const form = await event.request.formData();
		const parsed = idField.safeParse({ id: form.get('id') });
		if (!parsed.success) return fail(400, { action: 'events', message: 'Choose a log line.' });
		const unconfirmed = requireConfirmation(event, form, 'Remove this line from the log?');
		if (unconfirmed) return unconfirmed;
		return write(event, 'events', async (owner, plantId, transaction) => {
			const removed = await deletePlantEvent(owner, plantId, parsed.data.id, { transaction });
			if (!removed) throw new PlantInputError('id', 'That log line is not in this plant’s log.');
			return 'Removed from the log.';
		});
	},
	potSucker: async (event) => {
		const form = await event.request.formData();
		const parsed = potSuckerSchema.safeParse({
			happenedOn: form.get('happenedOn') ?? '',
			potSize: lengthField(form, 'potSize'),
			label: form.get('label') ?? ''
		});
		if (!parsed.success) return invalid('potSucker', parsed.error);
		return write(event, 'potSucker', async (owner, plantId, transaction) => {
			const child = await potUpSucker(owner, plantId, parsed.data, { transaction });
			return child.id;
		});
	},
	photo: async (event) => {
		const form = await event.request.formData();
		const parsed = photoSchema.safeParse({ caption: form.get('caption') ?? '' });
		if (!parsed.success) return invalid('photo', parsed.error);
		const upload = readOnePhoto(form);
		if (!upload.ok) {
			const message = upload.message;
			return fail(400, { action: 'photo', message, errors: { photo: message } });
		}
		return write(event, 'photo', async (owner, plantId, transaction) => {
			await addPlantPhoto(owner, plantId, upload.file, parsed.data.caption, { transaction });
			return 'Photo added.';
		});
	},
	deletePhoto: async (event) => {
		const form = await event.request.formData();
		const parsed = idField.safeParse({ id: form.get('id') });
		if (!parsed.success) return fail(400, { action: 'photo', message: 'Choose a photo.' });
		const unconfirmed = requireConfirmation(event, form, 'Delete this photo?');
		if (unconfirmed) return unconfirmed;
		return write(event, 'photo', async (owner, plantId, transaction) => {
			const removed = await deletePlantPhoto(owner, plantId, parsed.data.id, { transaction });
			if (!removed) throw new PlantInputError('id', 'That photo is not among this plant’s photos.');
			return 'Photo deleted.';
		});
	},
	gone: async (event) => {
		const form = await event.request.formData();
		const values = form.getAll('goneOn');
		const goneOn = values[0] ? String(values[0]) : null;
		// The form always sends one goneOn: a date (no longer grown) or empty (back again).
		const realDate =
			goneOn !== null &&
			isIsoDate(goneOn) &&
			goneOn >= '1900-01-01' &&
			compareIsoDates(goneOn, addCalendarDays(todayIn('UTC'), 1)) <= 0;
		if (values.length !== 1 || (goneOn !== null && !realDate)) {
			return fail(400, { action: 'gone', message: 'Give the date as a real date.' });
		}
		if (goneOn) {
			const unconfirmed = requireConfirmation(
				event,
				form,
				'Take this plant out of the collection?'
			);
			if (unconfirmed) return unconfirmed;
		}
		return write(event, 'gone', async (owner, plantId, transaction) => {
			await setPlantGone(owner, plantId, goneOn, { transaction });
			return goneOn ? 'Marked as no longer grown.' : 'Back in the collection.';
		});
	}
};
