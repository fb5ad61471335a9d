import { error } from '@sveltejs/kit';
import { listCapturedMail } from '$lib/server/mail/captured';
import type { PageServerLoad } from './$types';

/** Development only: the mail the local SMTP fake caught, so a person can follow sign-in links. */
export const load: PageServerLoad = async () => {
	let messages;
	try {
		messages = await listCapturedMail();
	} catch {
		error(503, 'The local SMTP fake is not running. Start the demo with npm run demo.');
	}
	if (messages === null) error(404, 'Not found');
	return { messages };
};
