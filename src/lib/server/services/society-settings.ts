import type { Transaction } from 'sequelize';
import { settingsFrom, type SocietySettings } from '$lib/domain/society-settings';
import { Show, Society } from '../db';

/** The settings a society's pages and documents follow (defaults for a value not set). */
export async function loadSocietySettings(
	societyId: string,
	options: { transaction?: Transaction } = {}
): Promise<SocietySettings> {
	const society = await Society.findByPk(societyId, {
		attributes: ['country', 'lengthUnit', 'paperSize', 'timeZone', 'currency'],
		transaction: options.transaction
	});
	return settingsFrom(society ? society.get({ plain: true }) : {});
}

/** The settings of the society that holds a show. */
export async function loadShowSocietySettings(
	showId: string,
	options: { transaction?: Transaction } = {}
): Promise<SocietySettings> {
	const show = await Show.findByPk(showId, {
		attributes: ['societyId'],
		transaction: options.transaction
	});
	return show ? loadSocietySettings(show.societyId, options) : settingsFrom({});
}
