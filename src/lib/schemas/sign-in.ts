import { z } from 'zod';
import { text } from './text';

/** Only paths inside Crownbench may follow a sign-in (no open redirects). */
export const safeNextPath = text()
	.regex(/^\/(?![/\\])[^\s]*$/, 'Not a path inside Crownbench.')
	.max(500)
	.catch('/home');

/** The sign-in form: an e-mail address, and where to go afterwards. */
export const signInSchema = z.object({
	email: text({ error: 'Enter your e-mail address.' })
		.trim()
		.min(1, 'Enter your e-mail address.')
		.max(254, 'That address is too long.')
		.pipe(z.email('Enter a complete e-mail address, like name@example.org.'))
		// `.invalid` is reserved never to exist (RFC 6761): walk-ins who left no address get one.
		.refine((email) => !/\.invalid$/i.test(email), 'That address cannot receive mail.'),
	redirectTo: safeNextPath
});
