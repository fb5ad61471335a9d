import { formatMoney } from '../../domain/money';
import { escapeHtml } from '../mail/escape';

interface Message {
	subject: string;
	text: string;
	html: string;
}

function html(paragraphs: string[]): string {
	return `<!doctype html><html><body style="font-family: sans-serif; color: #1f2a24">${paragraphs
		.map((p) => `<p>${escapeHtml(p)}</p>`)
		.join('')}</body></html>`;
}

function build(subject: string, lines: string[]): Message {
	return { subject, text: lines.join('\n\n'), html: html(lines) };
}

/** The receipt for a recorded payment (dues or entry fees). */
export function paymentReceiptMessage(input: {
	societyName: string;
	description: string;
	amountCents: number;
	currency: string;
	paidOn: string;
	reference: string;
	note?: string;
}): Message {
	const amount = formatMoney(input.amountCents, input.currency);
	return build(`Receipt from ${input.societyName}: ${amount}`, [
		`Thank you. ${input.societyName} has received your payment.`,
		`For: ${input.description}`,
		`Amount: ${amount}`,
		`Paid on: ${input.paidOn}`,
		`Reference: ${input.reference}`,
		...(input.note ? [input.note] : []),
		'Keep this message as your receipt.'
	]);
}

/** The message sent when money goes back to a member (a withdrawn entry, a payment made twice). */
export function refundMessage(input: {
	societyName: string;
	description: string;
	amountCents: number;
	currency: string;
	reference: string;
}): Message {
	const amount = formatMoney(input.amountCents, input.currency);
	return build(`Refund from ${input.societyName}: ${amount}`, [
		`${input.societyName} has refunded ${amount} to the card you paid with.`,
		`For: ${input.description}`,
		`Reference: ${input.reference}`,
		'It can take a few days to show on your statement.'
	]);
}

/** An invitation to join a society's space on Crownbench, with the sign-in link. */
export function invitationMessage(input: {
	societyName: string;
	invitedBy: string;
	roles: string[];
	signInUrl: string;
}): Message {
	const roles = input.roles.length ? input.roles.join(', ') : 'member of the society';
	const lines = [
		`${input.invitedBy} has invited you to ${input.societyName} on Crownbench, where the society runs its shows.`,
		`You can take part as: ${roles}.`,
		`Sign in with this e-mail address here: ${input.signInUrl}`,
		'You will get a one-time sign-in link by e-mail; no password is needed.',
		'If you did not expect this invitation, you can ignore this message.'
	];
	const text = lines.join('\n\n');
	const safeUrl = escapeHtml(input.signInUrl);
	const body = `<!doctype html><html><body style="font-family: sans-serif; color: #1f2a24">
<p>${escapeHtml(lines[0])}</p><p>${escapeHtml(lines[1])}</p>
<p><a href="${safeUrl}" style="display:inline-block;padding:12px 20px;background:#2f6d4f;color:#ffffff;border-radius:8px;text-decoration:none">Sign in to Crownbench</a></p>
<p style="font-size:14px">${escapeHtml(lines[3])} ${escapeHtml(lines[4])}</p></body></html>`;
	return { subject: `You are invited to ${input.societyName} on Crownbench`, text, html: body };
}
