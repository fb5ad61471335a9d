import { fail, redirect } from '@sveltejs/kit';
import { signIn } from '$lib/server/auth';
import { safeNextPath, signInSchema } from '$lib/schemas/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	const next = safeNextPath.parse(url.searchParams.get('next') ?? '/home');
	if (locals.user) redirect(303, next);
	return { next };
};

export const actions: Actions = {
	default: async (event) => {
		const form = Object.fromEntries(await event.request.clone().formData());
		const parsed = signInSchema.safeParse(form);
		if (!parsed.success) {
			const errors = parsed.error.flatten().fieldErrors;
			return fail(400, {
				email: typeof form.email === 'string' ? form.email : '',
				message: errors.email?.[0] ?? 'Check the form and try again.'
			});
		}
		await signIn(event);
	}
};
