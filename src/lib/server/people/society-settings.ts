import type { Transaction } from 'sequelize';
import { settingsFrom, type SocietySettings } from '$lib/domain/society-settings';
import { Society } from '../db';

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
