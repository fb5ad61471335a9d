'use strict';

/**
 * Demo judging for the spring show of Larkspur Valley: two panels, their classes, and a few
 * score sheets so the chair's progress board shows a show being judged.
 *
 * Panel A: judge1 and judge2, with clerk@ as panel clerk. Panel B: judge2 and judge3.
 * judge3 has an entry in class 10 and her household (Birchwood) has entries in classes 4, 14,
 * 16 and 20, so all of those go to Panel A. The clerk's own entry (class 15) is with Panel B.
 * The sheets are invented demo scores on the built-in scale (deductions in half points).
 */

const { randomUUID } = require('node:crypto');

const SOCIETY = 'larkspur-valley';
const PANEL_A_CLASSES = [
	'1',
	'2',
	'3',
	'4',
	'5',
	'6',
	'7',
	'8',
	'9',
	'10',
	'11',
	'14',
	'16',
	'20',
	'22',
	'23',
	'24',
	'25',
	'26',
	'27'
];
const PANEL_B_CLASSES = ['12', '13', '15', '17', '18', '19', '21'];

/** Invented demo deductions per judge, in the built-in scale's order. */
const DEMO_SHEETS = {
	1: { judge1: [1, 1.5, 0.5, 0.5, 0], judge2: [1.5, 1, 1, 0, 0.5] },
	2: { judge1: [3, 2, 4, 1, 1], judge2: [2.5, 2.5, 3.5, 1, 0.5] }
};
const KEYS = [
	'symmetry',
	'condition',
	'quantity_of_bloom',
	'size_and_type_of_blossom',
	'color_of_blossom'
];

module.exports = {
	async up(queryInterface) {
		const q = (sql, replacements, transaction) =>
			queryInterface.sequelize.query(sql, { replacements, transaction, type: 'SELECT' });
		await queryInterface.sequelize.transaction(async (transaction) => {
			const [show] = await q(
				`SELECT s.id FROM shows s JOIN societies so ON so.id = s.society_id
				  WHERE so.slug = :slug AND s.name LIKE 'Spring Show%' ORDER BY s.judging_day DESC LIMIT 1`,
				{ slug: SOCIETY },
				transaction
			);
			if (!show) return; // the demo show is not there: nothing to add
			const users = await q(
				`SELECT id, email FROM users WHERE email IN ('judge1@crownbench.test','judge2@crownbench.test','judge3@crownbench.test','clerk@crownbench.test')`,
				{},
				transaction
			);
			const user = Object.fromEntries(users.map((u) => [u.email.split('@')[0], u.id]));
			const classes = await q(
				'SELECT id, code FROM classes WHERE show_id = :showId',
				{ showId: show.id },
				transaction
			);
			const classId = Object.fromEntries(classes.map((c) => [c.code, c.id]));

			const panelA = randomUUID();
			const panelB = randomUUID();
			await queryInterface.bulkInsert(
				'panels',
				[
					{ id: panelA, show_id: show.id, name: 'Panel A', clerk_id: user.clerk },
					{ id: panelB, show_id: show.id, name: 'Panel B', clerk_id: null }
				],
				{ transaction }
			);
			await queryInterface.bulkInsert(
				'panel_judges',
				[
					{ panel_id: panelA, user_id: user.judge1 },
					{ panel_id: panelA, user_id: user.judge2 },
					{ panel_id: panelB, user_id: user.judge2 },
					{ panel_id: panelB, user_id: user.judge3 }
				],
				{ transaction }
			);
			await queryInterface.bulkInsert(
				'panel_classes',
				[
					...PANEL_A_CLASSES.map((code) => ({ class_id: classId[code], panel_id: panelA })),
					...PANEL_B_CLASSES.map((code) => ({ class_id: classId[code], panel_id: panelB }))
				],
				{ transaction }
			);

			// Demo sheets: the first entry (by number) of classes 1 and 2, and their audit rows.
			for (const [code, byJudge] of Object.entries(DEMO_SHEETS)) {
				const [entry] = await q(
					`SELECT id FROM entries WHERE class_id = :classId AND status NOT IN ('withdrawn','scratched')
					  ORDER BY number LIMIT 1`,
					{ classId: classId[code] },
					transaction
				);
				if (!entry) continue;
				for (const [judge, points] of Object.entries(byJudge)) {
					const deductions = Object.fromEntries(KEYS.map((k, i) => [k, points[i]]));
					const total = 100 - points.reduce((a, b) => a + b, 0);
					const sheetId = randomUUID();
					await queryInterface.sequelize.query(
						`INSERT INTO score_sheets (id, show_id, entry_id, kind, judge_id, deductions, comment, version, updated_by)
						 VALUES (:id, :showId, :entryId, 'judge', :judgeId, CAST(:deductions AS jsonb), :comment, 1, :judgeId)`,
						{
							replacements: {
								id: sheetId,
								showId: show.id,
								entryId: entry.id,
								judgeId: user[judge],
								deductions: JSON.stringify(deductions),
								comment: 'Well grown; a few spent blossoms to remove.'
							},
							transaction
						}
					);
					await queryInterface.sequelize.query(
						`INSERT INTO score_audit (show_id, sheet_id, entry_id, actor_id, actor_email, before, after)
						 VALUES (:showId, :sheetId, :entryId, :actorId, :email, NULL, CAST(:after AS jsonb))`,
						{
							replacements: {
								showId: show.id,
								sheetId,
								entryId: entry.id,
								actorId: user[judge],
								email: `${judge}@crownbench.test`,
								after: JSON.stringify({
									version: 1,
									deductions,
									total,
									comment: '',
									notJudged: null,
									judgesChoiceRank: null
								})
							},
							transaction
						}
					);
				}
			}
		});
	},

	async down(queryInterface) {
		await queryInterface.sequelize.transaction(async (transaction) => {
			const shows = `SELECT s.id FROM shows s JOIN societies so ON so.id = s.society_id WHERE so.slug = :slug`;
			const run = (sql) =>
				queryInterface.sequelize.query(sql, { replacements: { slug: SOCIETY }, transaction });
			await run(`DELETE FROM score_audit WHERE show_id IN (${shows})`);
			await run(`DELETE FROM score_sheets WHERE show_id IN (${shows})`);
			await run(`DELETE FROM panels WHERE show_id IN (${shows})`);
		});
	}
};
