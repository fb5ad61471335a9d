'use strict';

/**
 * Demo collections: member@crownbench.test and two exhibitors grow plants at home, with lineage
 * (leaves and suckers rooted from their own plants) and logs. Invented, like the rest of the demo.
 * Dates are counted back from the day the seed runs, so that against the spring show (judging
 * in 41 days) the member's collection shows every readiness case: ready, a sucker to remove,
 * a trailer short of crowns, a semiminiature over its size limit, a plant got too recently, and
 * one with no bloom logged lately.
 */

const { randomUUID } = require('node:crypto');

const OWNERS = [
	'member@crownbench.test',
	'exhibitor1@crownbench.test',
	'exhibitor2@crownbench.test'
];

function today() {
	const now = new Date();
	return new Date(now.getFullYear(), now.getMonth(), now.getDate());
}

function daysAgo(n) {
	const d = today();
	return iso(new Date(d.getFullYear(), d.getMonth(), d.getDate() - n));
}

function iso(day) {
	const pad = (n) => String(n).padStart(2, '0');
	return `${day.getFullYear()}-${pad(day.getMonth() + 1)}-${pad(day.getDate())}`;
}

/**
 * Plants: [key, owner, variety, label, how, days ago got, parent key, pot in, events]. Events:
 * [kind, days ago, { diameter, crowns, pot, note, child }].
 */
// prettier-ignore
const PLANTS = [
	// member@crownbench.test
	['granary', 'member@crownbench.test', 'Granary Snow', null, 'traded', 200, null, '5.00', [
		['repotted', 150, { pot: '5.00' }],
		['measured', 20, { diameter: '12.50', crowns: 1 }],
		['groomed', 14, {}],
		['in_bloom', 9, {}]
	]],
	['lantern', 'member@crownbench.test', 'Lantern Cove', 'east window', 'bought', 260, null, '4.50', [
		['in_bloom', 30, {}],
		['sucker_potted', 25, { child: 'lanternSucker', pot: '2.25' }],
		['measured', 12, { diameter: '11.00', crowns: 2, note: 'Another sucker low on the neck.' }],
		['in_bloom', 6, {}]
	]],
	['lanternSucker', 'member@crownbench.test', 'Lantern Cove', null, 'sucker', 25, 'lantern', '2.25', []],
	['granaryLeaf', 'member@crownbench.test', 'Granary Snow', 'leaf baby', 'leaf', 140, 'granary', '3.00', [
		['repotted', 60, { pot: '3.00' }],
		['measured', 30, { diameter: '7.00', crowns: 1 }]
	]],
	['granaryLeafSucker', 'member@crownbench.test', 'Granary Snow', null, 'sucker', 5, 'granaryLeaf', '2.00', []],
	['larkspur', 'member@crownbench.test', 'Wandering Larkspur', null, 'bought', 300, null, '5.00', [
		['measured', 18, { diameter: '10.00', crowns: 2 }],
		['in_bloom', 15, {}]
	]],
	['kiln', 'member@crownbench.test', 'Kiln Spark', null, 'bought', 220, null, '3.50', [
		['pest_treatment', 90, { note: 'Mealybug on two leaves; treated as the product label says.' }],
		['disbudded', 45, {}],
		['measured', 10, { diameter: '8.50', crowns: 1 }],
		['in_bloom', 8, {}]
	]],
	['harbor', 'member@crownbench.test', 'Harbor Dusk', null, 'bought', 420, null, '5.00', [
		['in_bloom', 11, {}]
	]],
	// exhibitor1@crownbench.test
	['foxglove', 'exhibitor1@crownbench.test', 'Foxglove Parlour', null, 'bought', 330, null, '5.00', [
		['sucker_removed', 40, {}],
		['in_bloom', 12, {}]
	]],
	['foxgloveLeaf', 'exhibitor1@crownbench.test', 'Foxglove Parlour', null, 'leaf', 120, 'foxglove', '2.50', []],
	// exhibitor2@crownbench.test
	['ember', 'exhibitor2@crownbench.test', 'Creeping Ember Lane', null, 'traded', 380, null, '6.00', [
		['measured', 30, { diameter: '14.00', crowns: 6 }],
		['in_bloom', 20, {}]
	]],
	['emberDivision', 'exhibitor2@crownbench.test', 'Creeping Ember Lane', 'small half', 'division', 70, 'ember', '4.00', [
		['measured', 20, { crowns: 3 }]
	]]
];

module.exports = {
	async up(queryInterface) {
		await queryInterface.sequelize.transaction(async (transaction) => {
			const [users] = await queryInterface.sequelize.query(
				'SELECT id, email FROM users WHERE email IN (:emails)',
				{ replacements: { emails: OWNERS }, transaction }
			);
			const [varieties] = await queryInterface.sequelize.query(
				`SELECT v.id, v.name FROM varieties v JOIN societies s ON s.id = v.society_id
				  WHERE s.slug = 'larkspur-valley'`,
				{ transaction }
			);
			if (users.length === 0 || varieties.length === 0) return; // the demo seed is not there
			const userId = Object.fromEntries(users.map((u) => [u.email, u.id]));
			const varietyId = Object.fromEntries(varieties.map((v) => [v.name, v.id]));
			const plantId = Object.fromEntries(PLANTS.map(([key]) => [key, randomUUID()]));

			const plantRows = PLANTS.map(([key, owner, variety, label, how, ago, parent, pot]) => {
				if (!userId[owner] || !varietyId[variety]) {
					throw new Error(`demo collections: unknown owner or variety for ${key}`);
				}
				return {
					id: plantId[key],
					owner_id: userId[owner],
					variety_id: varietyId[variety],
					label,
					obtained_how: how,
					obtained_on: daysAgo(ago),
					parent_id: parent ? plantId[parent] : null,
					pot_size_in: pot,
					notes: null,
					gone_on: null
				};
			});
			// Parents first, so the same-owner foreign key is satisfied row by row.
			await queryInterface.bulkInsert('plants', plantRows, { transaction });

			const eventRows = [];
			PLANTS.forEach(([key, , , , , , , , events]) => {
				events.forEach(([kind, ago, extra], i) => {
					eventRows.push({
						id: randomUUID(),
						plant_id: plantId[key],
						kind,
						happened_on: daysAgo(ago),
						diameter_in: extra.diameter ?? null,
						crowns: extra.crowns ?? null,
						pot_size_in: extra.pot ?? null,
						child_plant_id: extra.child ? plantId[extra.child] : null,
						note: extra.note ?? null,
						created_at: new Date(Date.now() - (1000 - i) * 1000)
					});
				});
			});
			await queryInterface.bulkInsert('plant_events', eventRows, { transaction });
		});
	},

	async down(queryInterface) {
		// Every plant grown from the demo registries (also those added while trying the demo).
		await queryInterface.sequelize.query(
			`DELETE FROM plants WHERE variety_id IN (
			   SELECT v.id FROM varieties v JOIN societies s ON s.id = v.society_id
			    WHERE s.slug IN ('larkspur-valley', 'cedar-ridge'))`
		);
	}
};
