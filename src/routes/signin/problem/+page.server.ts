import type { PageServerLoad } from './$types';

const MESSAGES: Record<string, string> = {
	Verification: 'This sign-in link has expired or has already been used. Ask for a new link below.',
	AccessDenied: 'This address may not sign in.',
	Configuration: 'Sign-in is not set up correctly on this server. Tell the site administrator.'
};

export const load: PageServerLoad = ({ url }) => {
	const code = url.searchParams.get('error') ?? '';
	return { message: MESSAGES[code] ?? 'Signing in did not work. Ask for a new link below.' };
};
