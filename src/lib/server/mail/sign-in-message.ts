import { escapeHtml } from './escape';

/** The sign-in e-mail: a link that works once, within its time limit. */
export function buildSignInMessage(
	url: string,
	host: string,
	minutes: number
): { subject: string; text: string; html: string } {
	const subject = 'Your Crownbench sign-in link';
	const text = [
		`Use this link to sign in to Crownbench at ${host}:`,
		'',
		url,
		'',
		`The link works once and expires in ${minutes} minutes.`,
		'If you did not ask to sign in, you can ignore this message.'
	].join('\n');
	const safeUrl = escapeHtml(url);
	const html = `<!doctype html><html><body style="font-family: sans-serif; color: #1f2a24">
<p>Use this link to sign in to Crownbench at ${escapeHtml(host)}:</p>
<p><a href="${safeUrl}" style="display:inline-block;padding:12px 20px;background:#2f6d4f;color:#ffffff;border-radius:8px;text-decoration:none">Sign in to Crownbench</a></p>
<p style="font-size:14px">Or paste this address into your browser: ${safeUrl}</p>
<p style="font-size:14px">The link works once and expires in ${minutes} minutes. If you did not ask to sign in, you can ignore this message.</p>
</body></html>`;
	return { subject, text, html };
}
