import type { Transaction } from 'sequelize';
import { MailPreference } from '../db';

/** The kinds of optional e-mail a person can turn off, one column each. */
export interface MailPreferences {
	/** Entries closing soon, with the member's plants that fit. */
	reminders: boolean;
	/** Placements after a show. */
	results: boolean;
}

/** A person's choices; everything is on until they turn it off. */
export async function getMailPreferences(userId: string): Promise<MailPreferences> {
	const row = await MailPreference.findByPk(userId);
	return { reminders: row?.reminders ?? true, results: row?.results ?? true };
}

/** Saves a person's choices. */
export async function setMailPreferences(
	userId: string,
	preferences: MailPreferences,
	options: { transaction: Transaction }
): Promise<void> {
	await MailPreference.upsert(
		{ userId, ...preferences, updatedAt: new Date() },
		{ transaction: options.transaction }
	);
}
