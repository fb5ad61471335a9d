import { fail, redirect } from '@sveltejs/kit';
import { signIn } from '$lib/server/auth';
import { takeSignInAttempt } from '$lib/server/http/rate-limit';
import { safeNextPath, signInSchema } from '$lib/schemas/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	const next = safeNextPath.parse(url.searchParams.get('next') ?? '/home');
	if (locals.user) redirect(303, next);
	return { next };
};

export const actions: Actions = {
	default: async (event) => {
		const body = await event.request
			.clone()
			.formData()
			.catch(() => null);
		if (!body)
			return fail(400, { email: '', message: 'Send the form as a form (it could not be read).' });
		const form = Object.fromEntries(body);
		const parsed = signInSchema.safeParse(form);
		if (!parsed.success) {
			const errors = parsed.error.flatten().fieldErrors;
			return fail(400, {
				email: typeof form.email === 'string' ? form.email : '',
				message: errors.email?.[0] ?? 'Check the form and try again.'
			});
		}
		const wait = await takeSignInAttempt(parsed.data.email, event.getClientAddress());
		if (wait !== null) {
			return fail(429, {
				email: parsed.data.email,
				message: `Too many sign-in links were asked for. Try again in ${wait} minute${wait === 1 ? '' : 's'}.`
			});
		}
		await signIn(event);
	}
};
