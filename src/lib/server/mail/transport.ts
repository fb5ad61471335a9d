import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';

/** The SMTP server mail goes through: SMTP_URL, or the local SMTP fake in development. */
export function smtpUrl(): string {
	return config().smtpUrl || 'smtp://127.0.0.1:2525';
}

/** The sender shown on every message. */
export function mailFrom(): string {
	return config().mailFrom || 'Crownbench <no-reply@crownbench.test>';
}

let transporter: Transporter | null = null;

/** One pooled Nodemailer transport for the process. */
export function getTransport(): Transporter {
	transporter ??= nodemailer.createTransport(smtpUrl());
	return transporter;
}

/** A message to send, in plain text with an optional HTML part. */
export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html?: string;
}

/** Sends one message now and returns the SMTP server's message id. */
export async function sendMail(mail: OutgoingMail): Promise<string> {
	const info = await getTransport().sendMail({ from: mailFrom(), ...mail });
	return String(info.messageId ?? '');
}
