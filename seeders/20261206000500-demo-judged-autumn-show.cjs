'use strict';

/**
 * Demo: an autumn show of Larkspur Valley that is judged but whose results are not yet published,
 * so the chair can publish them, print the award documents and watch the placements e-mails go.
 *
 * Invented throughout: the show, the entries and the judges' scores and comments. Panel of
 * judge1 and judge2 (mean of their sheets) on the built-in scale of points. exhibitor7 has turned
 * results e-mails off. Dates are relative to the day the seed runs: judged 50 days ago.
 */

const { randomUUID } = require('node:crypto');

const SOCIETY = 'larkspur-valley';
const SLUG_PREFIX = 'larkspur-autumn-';
const BUILT_IN_SCALE_NAME = 'Single-crowned standard, semiminiature and miniature plants';
const KEYS = [
	'symmetry',
	'condition',
	'quantity_of_bloom',
	'size_and_type_of_blossom',
	'color_of_blossom'
];
const MAX = [25, 25, 25, 15, 10];

const DIVISIONS = [
	{ code: 'A', name: 'Single-crowned plants' },
	{ code: 'B', name: 'Trailers' }
];
const CLASSES = [
	{ code: '1', division: 'A', name: 'Standard, blue or purple blossoms', habit: 'single_crown' },
	{ code: '2', division: 'A', name: 'Standard, any other color', habit: 'single_crown' },
	{ code: '3', division: 'A', name: 'Semiminiature, any color', habit: 'single_crown' },
	{ code: '4', division: 'B', name: 'Trailer, any size', habit: 'trailer' }
];

/**
 * Entries: class, exhibitor, the points each judge deducted in all, and their comments.
 * `notJudged` marks an entry the panel did not judge.
 */
const ENTRIES = [
	[
		'1',
		'member',
		4,
		5,
		'Crisp, even rosette; remove two spent blossoms.',
		'Good bloom count for the pot.'
	],
	['1', 'ex1', 8, 9, 'Slight gap at the back of the rosette.', ''],
	['1', 'ex2', 13, 12, 'Dusty lower leaves; bloom a little sparse.', ''],
	['1', 'ex3', 22, 20, 'Neck showing; leaves out of line.', ''],
	['2', 'ex1', 3, 3, 'Outstanding: full, even and clean.', 'A crown of bloom.'],
	['2', 'member', 11, 10, 'Lovely color; one marked leaf.', ''],
	['2', 'ex4', 18, 17, 'Bloom past its best.', ''],
	['2', 'ex7', 26, 28, 'Sucker at the base costs symmetry.', ''],
	['3', 'ex2', 6, 7, 'Neat and well groomed.', ''],
	['3', 'ex3', 9, 8, 'Good, a touch crowded in the centre.', ''],
	['3', 'ex6', 15, 16, 'Pot a little large for the plant.', ''],
	['3', 'member', 33, 35, 'Few blossoms open on the day.', ''],
	['4', 'ex4', 5, 6, 'Even trailing habit all round.', ''],
	['4', 'ex7', 7, 9, 'Well furnished; one crown leans.', ''],
	['4', 'ex1', 19, 18, 'Thin at one side.', ''],
	['4', 'ex6', null, null, '', '']
];

const PEOPLE = {
	member: 'member@crownbench.test',
	ex1: 'exhibitor1@crownbench.test',
	ex2: 'exhibitor2@crownbench.test',
	ex3: 'exhibitor3@crownbench.test',
	ex4: 'exhibitor4@crownbench.test',
	ex6: 'exhibitor6@crownbench.test',
	ex7: 'exhibitor7@crownbench.test',
	judge1: 'judge1@crownbench.test',
	judge2: 'judge2@crownbench.test',
	clerk: 'clerk@crownbench.test',
	chair: 'chair@crownbench.test'
};

/** Spreads a total deduction over the criteria in half points, never above a criterion's maximum. */
function spread(total) {
	const halves = KEYS.map(() => 0);
	let left = Math.round(total * 2);
	for (let i = 0; left > 0; i = (i + 1) % KEYS.length) {
		if (halves[i] < MAX[i] * 2) {
			halves[i] += 1;
			left -= 1;
		}
	}
	return Object.fromEntries(KEYS.map((k, i) => [k, halves[i] / 2]));
}

function iso(day) {
	const pad = (n) => String(n).padStart(2, '0');
	return `${day.getFullYear()}-${pad(day.getMonth() + 1)}-${pad(day.getDate())}`;
}

function daysFromToday(n) {
	const now = new Date();
	return new Date(now.getFullYear(), now.getMonth(), now.getDate() + n);
}

module.exports = {
	async up(queryInterface) {
		const q = (sql, replacements, transaction) =>
			queryInterface.sequelize.query(sql, { replacements, transaction, type: 'SELECT' });
		await queryInterface.sequelize.transaction(async (transaction) => {
			const [society] = await q(
				'SELECT id FROM societies WHERE slug = :slug',
				{ slug: SOCIETY },
				transaction
			);
			if (!society) return; // the demo society is not there: nothing to add
			const users = await q(
				'SELECT id, email FROM users WHERE email IN (:emails)',
				{ emails: Object.values(PEOPLE) },
				transaction
			);
			const byEmail = Object.fromEntries(users.map((u) => [u.email, u.id]));
			const user = Object.fromEntries(
				Object.entries(PEOPLE).map(([key, email]) => [key, byEmail[email]])
			);
			if (Object.values(user).some((id) => !id)) return;
			const [scale] = await q(
				'SELECT id FROM scales WHERE society_id IS NULL AND name = :name LIMIT 1',
				{ name: BUILT_IN_SCALE_NAME },
				transaction
			);
			const varieties = await q(
				`SELECT id, habit FROM varieties WHERE society_id = :society AND NOT is_species ORDER BY name`,
				{ society: society.id },
				transaction
			);
			const pick = (habit, i) => {
				const fitting = varieties.filter((v) => v.habit === habit);
				const list = fitting.length > 0 ? fitting : varieties;
				return list[i % list.length].id;
			};

			const judgingDay = daysFromToday(-50);
			const year = judgingDay.getFullYear();
			const showId = randomUUID();
			const divisionId = Object.fromEntries(DIVISIONS.map((d) => [d.code, randomUUID()]));
			const classId = Object.fromEntries(CLASSES.map((c) => [c.code, randomUUID()]));
			const classIds = (codes) => codes.map((code) => classId[code]);

			await queryInterface.bulkInsert(
				'shows',
				[
					{
						id: showId,
						society_id: society.id,
						name: `Autumn Show ${year}`,
						slug: `${SLUG_PREFIX}${year}`,
						venue: 'Larkspur Valley Grange Hall, 12 Orchard Lane',
						entries_open: iso(daysFromToday(-90)),
						entries_close: iso(daysFromToday(-53)),
						entry_day: iso(daysFromToday(-51)),
						judging_day: iso(judgingDay),
						public_hours: 'Open to the public on judging day 2 pm to 5 pm.',
						panel_score_method: 'mean',
						next_entry_number: ENTRIES.length + 1,
						schedule_published_at: daysFromToday(-120),
						results_published_at: null,
						award_rules: JSON.stringify({
							system: 'merit',
							merit: { blue: 90, red: 80, white: 70 },
							bestInClassMin: null,
							tieBreak: { criterionKey: null, useJudgesChoice: true },
							sweepstakesTieBreak: 'none',
							topAwards: [
								{
									id: 'best-in-show',
									name: 'Best in show',
									classIds: classIds(['1', '2', '3']),
									minScore: 90
								},
								{
									id: 'best-trailer',
									name: 'Best trailer',
									classIds: classIds(['4']),
									minScore: 90
								}
							]
						})
					}
				],
				{ transaction }
			);
			await queryInterface.bulkInsert(
				'divisions',
				DIVISIONS.map((d, i) => ({
					id: divisionId[d.code],
					show_id: showId,
					code: d.code,
					name: d.name,
					kind: 'horticulture',
					position: i + 1
				})),
				{ transaction }
			);
			await queryInterface.bulkInsert(
				'classes',
				CLASSES.map((c, i) => ({
					id: classId[c.code],
					show_id: showId,
					division_id: divisionId[c.division],
					code: c.code,
					name: c.name,
					position: i + 1,
					habit: c.habit,
					scale_id: scale ? scale.id : null
				})),
				{ transaction }
			);
			const panelId = randomUUID();
			await queryInterface.bulkInsert(
				'panels',
				[{ id: panelId, show_id: showId, name: 'Panel A', clerk_id: user.clerk }],
				{ transaction }
			);
			await queryInterface.bulkInsert(
				'panel_judges',
				[
					{ panel_id: panelId, user_id: user.judge1 },
					{ panel_id: panelId, user_id: user.judge2 }
				],
				{ transaction }
			);
			await queryInterface.bulkInsert(
				'panel_classes',
				CLASSES.map((c) => ({ class_id: classId[c.code], panel_id: panelId })),
				{ transaction }
			);

			const entryRows = [];
			const sheetRows = [];
			ENTRIES.forEach(([code, who, d1, d2, c1, c2], i) => {
				const entryId = randomUUID();
				const cls = CLASSES.find((c) => c.code === code);
				entryRows.push({
					id: entryId,
					show_id: showId,
					class_id: classId[code],
					exhibitor_id: user[who],
					variety_id: pick(cls.habit, i),
					number: i + 1,
					status: 'checked_in',
					checked_in_at: judgingDay,
					checked_in_by: user.clerk
				});
				for (const [judge, total, comment] of [
					['judge1', d1, c1],
					['judge2', d2, c2]
				]) {
					sheetRows.push({
						id: randomUUID(),
						show_id: showId,
						entry_id: entryId,
						kind: 'judge',
						judge_id: user[judge],
						deductions: JSON.stringify(total === null ? {} : spread(total)),
						comment,
						not_judged_reason: total === null ? 'not_in_bloom' : null,
						version: 1,
						updated_by: user[judge]
					});
				}
			});
			await queryInterface.bulkInsert('entries', entryRows, { transaction });
			for (const s of sheetRows) {
				await queryInterface.sequelize.query(
					`INSERT INTO score_sheets (id, show_id, entry_id, kind, judge_id, deductions, comment, not_judged_reason, version, updated_by)
					 VALUES (:id, :show_id, :entry_id, :kind, :judge_id, CAST(:deductions AS jsonb), :comment, :not_judged_reason, :version, :updated_by)`,
					{ replacements: s, transaction }
				);
			}
			await queryInterface.sequelize.query(
				`INSERT INTO mail_preferences (user_id, results) VALUES (:id, false)
				 ON CONFLICT (user_id) DO UPDATE SET results = false`,
				{ replacements: { id: user.ex7 }, transaction }
			);
		});
	},

	async down(queryInterface) {
		await queryInterface.sequelize.transaction(async (transaction) => {
			const run = (sql) =>
				queryInterface.sequelize.query(sql, {
					replacements: { prefix: `${SLUG_PREFIX}%`, email: PEOPLE.ex7 },
					transaction
				});
			const shows = `SELECT id FROM shows WHERE slug LIKE :prefix`;
			await run(`DELETE FROM entries WHERE show_id IN (${shows})`);
			await run(`DELETE FROM shows WHERE slug LIKE :prefix`);
			await run(
				`DELETE FROM mail_preferences WHERE user_id IN (SELECT id FROM users WHERE email = :email)`
			);
		});
	}
};
