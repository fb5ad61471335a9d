import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { sequelize } from '$lib/server/db';
import { listFailedJobs, retryFailedJob } from '$lib/server/jobs/failed';
import { requireRole } from '$lib/server/policies';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import { chooseSociety } from '$lib/server/people/society-choice';
import type { Actions, PageServerLoad } from './$types';

/** The society's background jobs that failed for good (e-mails, refunds, documents), newest first. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const [jobs, settings] = await Promise.all([
		listFailedJobs(society.societyId),
		loadSocietySettings(society.societyId)
	]);
	return { society, jobs, timeZone: settings.timeZone };
};

const retrySchema = z.strictObject({
	societyId: z.uuid({ error: 'Say which society this is.' }),
	jobId: z.uuid({ error: 'Choose a failed job to try again.' })
});

export const actions: Actions = {
	/** Puts one failed job back in line (and the e-mail or document it works on). */
	retry: async (event) => {
		const parsed = retrySchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		requireRole(event, ['admin'], parsed.data.societyId);
		const done = await sequelize.transaction((transaction) =>
			retryFailedJob(parsed.data.societyId, parsed.data.jobId, { transaction })
		);
		if (!done) {
			return fail(400, { message: 'That job is not a failed job of this society.' });
		}
		return { ok: true, message: 'The job is back in line and runs again in a moment.' };
	}
};
