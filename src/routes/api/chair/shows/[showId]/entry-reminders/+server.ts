import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { Show, sequelize } from '$lib/server/db';
import { requireRole } from '$lib/server/policies';
import { queueEntryReminders } from '$lib/server/plants/reminders';
import { societyToday } from '$lib/server/people/society-today';
import type { RequestHandler } from './$types';

/**
 * The chair sends the entry reminders of a show now (members with plants that fit, reminders
 * on). Members who already got this show's reminder are skipped, so it is safe to repeat.
 */
export const POST: RequestHandler = async (event) => {
	requireRole(event, ['chair']);
	if (!z.uuid().safeParse(event.params.showId).success) error(404, 'This show does not exist.');
	const show = await Show.findByPk(event.params.showId, { attributes: ['id', 'societyId'] });
	if (!show) error(404, 'This show does not exist.');
	requireRole(event, ['chair'], show.societyId);
	const queued = await sequelize.transaction(async (transaction) =>
		queueEntryReminders(show.id, {
			transaction,
			today: await societyToday(show.societyId, { transaction })
		})
	);
	return json({ queued });
};
