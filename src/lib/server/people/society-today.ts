import type { Transaction } from 'sequelize';
import { todayIn, type IsoDate } from '$lib/domain/dates';
import { DEFAULT_SOCIETY_SETTINGS, type SocietySettings } from '$lib/domain/society-settings';
import { Society } from '../db';
import { loadSocietySettings } from './society-settings';

/**
 * Today's date in a society's time zone: the day that decides whether its entries are open, its
 * reminders go out and its members are in good standing.
 */
export async function societyToday(
	societyId: string,
	options: { transaction?: Transaction; now?: Date } = {}
): Promise<IsoDate> {
	const society = await Society.findByPk(societyId, {
		attributes: ['timeZone'],
		transaction: options.transaction
	});
	return todayIn(society?.timeZone ?? DEFAULT_SOCIETY_SETTINGS.timeZone, options.now);
}

/**
 * The settings a member's own collection follows (their plants, labels, readiness): those of the
 * society named by `slug` when they are a member there, else of the first society where they
 * are a member. A person who is a member nowhere gets the defaults on UTC.
 */
export async function loadMemberSettings(
	user: App.SignedInUser,
	slug: string | null = null
): Promise<SocietySettings> {
	const member = user.memberships.filter((m) => m.roles.includes('member'));
	const chosen = (slug && member.find((m) => m.societySlug === slug)) || member[0];
	if (!chosen) return { ...DEFAULT_SOCIETY_SETTINGS, timeZone: 'UTC' };
	return loadSocietySettings(chosen.societyId);
}
