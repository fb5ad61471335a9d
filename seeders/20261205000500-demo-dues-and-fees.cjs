'use strict';

/**
 * Demo dues and fees (invented demo settings, not published values): dues periods for both demo
 * societies, and an entry fee with a refund rule on Larkspur Valley's spring show. Entries seeded
 * before the fee was set keep "no fee", as entries made before an admin sets a fee do.
 * Periods start on the first day of the month the seed runs, so they are always open.
 */

function firstOfMonth(offsetMonths) {
	const now = new Date();
	return new Date(now.getFullYear(), now.getMonth() + offsetMonths, 1);
}

function iso(day) {
	const pad = (n) => String(n).padStart(2, '0');
	return `${day.getFullYear()}-${pad(day.getMonth() + 1)}-${pad(day.getDate())}`;
}

/** The last day of the month `months` after the month the seed runs in, minus one month. */
function endAfter(months) {
	const first = firstOfMonth(months);
	return new Date(first.getFullYear(), first.getMonth(), 0);
}

const SLUGS = ['larkspur-valley', 'cedar-ridge'];

module.exports = {
	async up(queryInterface) {
		const q = queryInterface.sequelize;
		await q.transaction(async (transaction) => {
			const [societies] = await q.query('SELECT id, slug FROM societies WHERE slug IN (:slugs)', {
				replacements: { slugs: SLUGS },
				transaction
			});
			const id = Object.fromEntries(societies.map((s) => [s.slug, s.id]));
			const start = iso(firstOfMonth(0));
			const rows = [];
			if (id['larkspur-valley']) {
				rows.push(
					{
						society_id: id['larkspur-valley'],
						label: 'One year of membership',
						amount_cents: 2500,
						starts_on: start,
						ends_on: iso(endAfter(12))
					},
					{
						society_id: id['larkspur-valley'],
						label: 'Two years of membership',
						amount_cents: 4500,
						starts_on: start,
						ends_on: iso(endAfter(24))
					}
				);
				await q.query(
					`UPDATE shows SET entry_fee_cents = 200, entry_fee_refund = 'until_entries_close'
					  WHERE society_id = :society`,
					{ replacements: { society: id['larkspur-valley'] }, transaction }
				);
			}
			if (id['cedar-ridge']) {
				rows.push({
					society_id: id['cedar-ridge'],
					label: 'Membership year',
					amount_cents: 3000,
					starts_on: start,
					ends_on: iso(endAfter(12))
				});
			}
			if (rows.length) await queryInterface.bulkInsert('dues_periods', rows, { transaction });
		});
	},

	async down(queryInterface) {
		const q = queryInterface.sequelize;
		await q.query(
			`DELETE FROM dues_periods WHERE society_id IN (SELECT id FROM societies WHERE slug IN (:slugs))`,
			{ replacements: { slugs: SLUGS } }
		);
		await q.query(
			`UPDATE shows SET entry_fee_cents = 0, entry_fee_refund = 'none'
			  WHERE society_id IN (SELECT id FROM societies WHERE slug IN (:slugs))`,
			{ replacements: { slugs: SLUGS } }
		);
	}
};
