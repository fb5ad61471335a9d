import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { sequelize } from '$lib/server/db';
import {
	requestShowPdfs,
	SHOW_DOCUMENTS,
	showPdfStates
} from '$lib/server/results/documents/show-pdf';
import { requireChairShow } from '$lib/server/results/chair-access';
import {
	loadResultsMail,
	loadShowResults,
	resendResultsMail
} from '$lib/server/results/show-results';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireChairShow(event, event.params.slug);
	if (!show.publishedAt) {
		return { show: { slug: show.slug, name: show.name, published: false }, results: null };
	}
	const [results, mail, documents] = await Promise.all([
		loadShowResults(show.id),
		loadResultsMail(show.id),
		showPdfStates(show.id)
	]);
	return {
		show: { slug: show.slug, name: show.name, published: true },
		results,
		mail,
		documents
	};
};

const resendSchema = z.object({ id: z.uuid({ error: 'Choose a message to send again.' }) });

const buildSchema = z.strictObject({
	document: z.enum(SHOW_DOCUMENTS, { error: 'Choose one of the documents to build.' }).optional()
});

export const actions: Actions = {
	/** Puts one placements e-mail back in line to be sent again now. */
	resend: async (event) => {
		const { show } = await requireChairShow(event, event.params.slug);
		const parsed = resendSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		const done = await sequelize.transaction((transaction) =>
			resendResultsMail(show.id, parsed.data.id, { transaction })
		);
		if (!done) {
			return fail(400, { message: 'That message is not one of this show, or it is being sent.' });
		}
		return { ok: true, message: 'The message is back in line and goes out in a moment.' };
	},
	/** Builds a document not built yet for this publication and paper, or one whose build failed. */
	build: async (event) => {
		const { show } = await requireChairShow(event, event.params.slug);
		const parsed = buildSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		if (!show.publishedAt) {
			return fail(409, {
				message: 'Publish the results first; the documents print what was published.'
			});
		}
		const queued = await sequelize.transaction((transaction) =>
			requestShowPdfs(show.id, {
				transaction,
				again: true,
				documents: parsed.data.document ? [parsed.data.document] : undefined
			})
		);
		if (queued === 0) return fail(400, { message: 'That document is built or being built.' });
		return { ok: true, message: 'The document is being built; this page shows when it is ready.' };
	}
};
