import type { Transaction } from 'sequelize';
import { compareIsoDates, isIsoDate, type IsoDate } from '$lib/domain/dates';
import { Membership } from '../db';

/** Where a member goes to pay dues and become current again. */
export const MEMBERSHIP_PAGE = '/my/membership';

/** True when dues paid through `duesPaidThrough` still cover `day` (both plain dates). */
export function duesCover(duesPaidThrough: string | null, day: IsoDate): boolean {
	return (
		duesPaidThrough !== null &&
		isIsoDate(duesPaidThrough) &&
		compareIsoDates(duesPaidThrough, day) >= 0
	);
}

/**
 * Whether a person is a member in good standing of a society on a day (the show's judging day):
 * their membership's dues are paid through that day or later. The one place this rule lives.
 */
export async function isInGoodStanding(
	userId: string,
	societyId: string,
	day: IsoDate,
	options: { transaction?: Transaction } = {}
): Promise<boolean> {
	const membership = await Membership.findOne({
		where: { userId, societyId },
		attributes: ['duesPaidThrough'],
		transaction: options.transaction
	});
	return duesCover(membership?.duesPaidThrough ?? null, day);
}
