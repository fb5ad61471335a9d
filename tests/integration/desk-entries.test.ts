import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import { consecutivePairs } from '../../src/lib/domain/entry-numbers';
import { checkInSchema, deskEntrySchema, type DeskEntryInput } from '../../src/lib/schemas/desk';
import {
	AuditEvent,
	Entry,
	Show,
	User,
	Variety,
	WalkInExhibitor,
	sequelize
} from '../../src/lib/server/db';
import { queueMail } from '../../src/lib/server/mail/outbox';
import {
	DeskEntryRefused,
	claimWalkIns,
	enterAtDesk
} from '../../src/lib/server/entries/desk-entries';
import { checkInEntry, loadDeskEntry } from '../../src/lib/server/entries/desk';
import { DeskProblem } from '../../src/lib/server/entries/desk-problem';

let spring: Show;
let show: Show;
let classId: string;
let variety: Variety;
let clerk: User;
const exhibitors: string[] = [];

const input = (over: Partial<DeskEntryInput> = {}): DeskEntryInput => ({
	who: 'walk_in',
	memberId: '',
	walkInName: 'Tamsin Orrery',
	walkInEmail: null,
	walkInHousehold: null,
	classId,
	varietyId: variety.id,
	acquiredOn: null,
	diameter: 10,
	crowns: 1,
	potSize: 4,
	unit: 'in',
	...over
});

const enter = (i: DeskEntryInput) =>
	sequelize.transaction((transaction) => enterAtDesk(show.id, clerk, i, { transaction }));

async function failure(promise: Promise<unknown>): Promise<unknown> {
	return promise.then(
		() => null,
		(e: unknown) => e
	);
}

beforeAll(async () => {
	spring = (await Show.findOne({ where: { slug: { [Op.like]: 'larkspur-spring-%' } } }))!;
	clerk = (await User.findOne({ where: { email: 'clerk@crownbench.test' } }))!;
	variety = (await Variety.findOne({
		where: {
			societyId: spring.societyId,
			sizeClass: 'standard',
			habit: 'single_crown',
			isSpecies: false
		}
	}))!;
	const scale = await sequelize.query<{ id: string }>(
		'SELECT id FROM scales WHERE society_id IS NULL ORDER BY created_at LIMIT 1',
		{ type: QueryTypes.SELECT }
	);
	// Entry day today, judging tomorrow, open to non-members, no possession period.
	const tag = randomUUID().slice(0, 8);
	const showId = randomUUID();
	await sequelize.query(
		`INSERT INTO shows (id, society_id, name, slug, entries_open, entries_close, entry_day, judging_day,
		                    require_good_standing, possession_months, schedule_published_at, next_entry_number)
		 VALUES ($1, $2, $3, $4, current_date - 30, current_date - 5, current_date, current_date + 1, false, 0, now(), 1)`,
		{ bind: [showId, spring.societyId, `Desk test ${tag}`, `desk-test-${tag}`] }
	);
	const division = randomUUID();
	await sequelize.query(
		`INSERT INTO divisions (id, show_id, code, name, position) VALUES ($1, $2, 'I', 'Standards', 1)`,
		{ bind: [division, showId] }
	);
	classId = randomUUID();
	await sequelize.query(
		`INSERT INTO classes (id, show_id, division_id, code, name, position, scale_id, max_pot_in)
		 VALUES ($1, $2, $3, '1', 'Standards', 1, $4, 6)`,
		{ bind: [classId, showId, division, scale[0].id] }
	);
	// 24 entries made online, exhibitor by exhibitor: numbers 1..24 in the order entered.
	const users = await User.findAll({ where: { email: { [Op.like]: 'exhibitor%' } }, limit: 4 });
	let n = 1;
	for (const u of users) {
		exhibitors.push(u.id);
		for (let i = 0; i < 6; i++) {
			await sequelize.query(
				`INSERT INTO entries (show_id, class_id, exhibitor_id, variety_id, number, status)
				 VALUES ($1, $2, $3, $4, $5, 'entered')`,
				{ bind: [showId, classId, u.id, variety.id, n++] }
			);
		}
	}
	await sequelize.query('UPDATE shows SET next_entry_number = $2 WHERE id = $1', {
		bind: [showId, n]
	});
	show = (await Show.findByPk(showId))!;
});

const madeUsers: string[] = [];

// Leaves the database as the seed made it (the migrations test takes the seed down and counts).
afterAll(async () => {
	const walkIns = await WalkInExhibitor.findAll({
		where: { createdBy: clerk.id },
		attributes: ['userId']
	});
	const users = [...madeUsers, ...walkIns.map((w) => w.userId)];
	await sequelize.query('DELETE FROM audit_events WHERE show_id = $1', { bind: [show.id] });
	await sequelize.query('DELETE FROM entries WHERE show_id = $1', { bind: [show.id] });
	await sequelize.query('DELETE FROM shows WHERE id = $1', { bind: [show.id] });
	if (users.length) {
		await sequelize.query('DELETE FROM walk_in_exhibitors WHERE user_id = ANY($1::uuid[])', {
			bind: [users]
		});
		await sequelize.query('DELETE FROM users WHERE id = ANY($1::uuid[])', { bind: [users] });
	}
	await sequelize.close();
});

describe('entries at the desk', () => {
	it('refuses while the desk takes no entries, writing nothing', async () => {
		const before = await User.count();
		const e = await failure(
			sequelize.transaction((transaction) =>
				enterAtDesk(spring.id, clerk, { ...input(), classId }, { transaction })
			)
		);
		expect(e).toBeInstanceOf(DeskProblem);
		expect((e as Error).message).toMatch(/^The desk takes entries from entry day/);
		expect(await User.count()).toBe(before);
	});

	it('refuses a plant that fails a desk check, keeping no walk-in record', async () => {
		const before = { users: await User.count(), walkIns: await WalkInExhibitor.count() };
		// Single crown with a sucker (state council show rules 2018, DOMAIN.md); pot 7 in over the class's 6 in.
		const e = await failure(enter(input({ crowns: 2, potSize: 7 })));
		expect(e).toBeInstanceOf(DeskEntryRefused);
		const failures = (e as DeskEntryRefused).failures;
		expect(failures.map((f) => f.code)).toEqual(['pot_over_limit', 'too_many_crowns']);
		expect(failures.every((f) => f.whatToDo.length > 0)).toBe(true);
		expect(await User.count()).toBe(before.users);
		expect(await WalkInExhibitor.count()).toBe(before.walkIns);
		expect(await Entry.count({ where: { showId: show.id } })).toBe(24);
	});

	it('refuses bad input at the form: a walk-in without a name, absurd measurements', () => {
		const form = {
			who: 'walk_in',
			memberId: '',
			walkInName: '',
			walkInEmail: '',
			walkInHousehold: '',
			classId,
			varietyId: variety.id,
			acquiredOn: '',
			diameter: '10',
			crowns: '1',
			potSize: '4',
			unit: 'in'
		};
		const issues = (over: Record<string, string>) => {
			const r = deskEntrySchema.safeParse({ ...form, ...over });
			return r.success ? [] : r.error.issues.map((i) => i.path.join('.'));
		};
		expect(issues({})).toEqual(['walkInName']);
		expect(issues({ walkInName: 'Tamsin Orrery', diameter: '-3' })).toEqual(['diameter']);
		expect(issues({ walkInName: 'Tamsin Orrery', potSize: '400' })).toEqual(['potSize']);
		expect(issues({ walkInName: 'Tamsin Orrery', crowns: '1.5' })).toEqual(['crowns']);
		expect(issues({ walkInName: 'Tamsin Orrery', walkInEmail: 'not-an-address' })).toEqual([
			'walkInEmail'
		]);
	});

	it('enters a walk-in, fixes the numbers in shuffled order first, and the walk-in claims it on sign-in', async () => {
		const email = `walk-in-${randomUUID().slice(0, 6)}@crownbench.test`;
		const entered = await enter(input({ walkInEmail: email, walkInHousehold: 'Orrery' }));
		const entry = (await Entry.findByPk(entered.id))!;
		expect(entry.status).toBe('checked_in');
		expect(Number(entry.measuredDiameterIn)).toBe(10);
		const user = (await User.findOne({ where: { email } }))!;
		expect(entry.exhibitorId).toBe(user.id);
		const walkIn = (await WalkInExhibitor.findOne({ where: { userId: user.id } }))!;
		expect(walkIn).toMatchObject({
			name: 'Tamsin Orrery',
			email,
			household: 'Orrery',
			claimedAt: null
		});

		const fresh = (await Show.findByPk(show.id))!;
		expect(fresh.entryNumbersFixedAt).not.toBeNull();
		const all = await Entry.findAll({ where: { showId: show.id } });
		expect(new Set(all.map((e) => e.number)).size).toBe(25);
		// Entered 1..6 per exhibitor; shuffled, no exhibitor's entries run on (common practice: blind judging).
		for (const id of exhibitors) {
			const own = all.filter((e) => e.exhibitorId === id).map((e) => e.number);
			expect(consecutivePairs(own)).toBeLessThan(3);
		}
		expect(
			await AuditEvent.count({ where: { showId: show.id, action: 'entry_numbers.fix' } })
		).toBe(1);

		// A second walk-in entry takes a free number of the shuffled range, and the numbers stay fixed.
		const second = await enter(input({ walkInName: 'Odile Marchbank' }));
		expect(all.map((e) => e.number)).not.toContain(second.number);
		expect(
			await AuditEvent.count({ where: { showId: show.id, action: 'entry_numbers.fix' } })
		).toBe(1);

		await claimWalkIns(user.id);
		expect((await WalkInExhibitor.findByPk(walkIn.id))!.claimedAt).not.toBeNull();
	});

	it('a walk-in without an address gets a stand-in that is never mailed', async () => {
		const entered = await enter(input({ walkInName: 'Bram Ellery' }));
		const user = (await User.findByPk((await Entry.findByPk(entered.id))!.exhibitorId))!;
		expect(user.email).toMatch(/@walk-in\.invalid$/);
		const queued = await sequelize.transaction((transaction) =>
			queueMail(
				[
					{
						kind: 'results',
						to: user.email,
						subject: 'Your placements',
						text: 'x',
						dedupeKey: randomUUID()
					}
				],
				{ transaction }
			)
		);
		expect(queued).toBe(0);
	});

	it('refuses a member who is not of the society', async () => {
		const outsider = await User.create({
			name: 'Nobody Here',
			email: `outsider-${randomUUID()}@example.org`,
			emailVerified: null,
			image: null
		});
		madeUsers.push(outsider.id);
		const e = await failure(enter(input({ who: 'member', memberId: outsider.id })));
		expect(e).toBeInstanceOf(DeskProblem);
	});
});

// A miniature Sinningia is sized by its longest leaf blade, at most 2.5 in (The Gesneriad Society
// convention show schedule 2018; New England chapter schedule 2022), as in plant-groups.ts.
describe('the longest leaf blade at the desk', () => {
	let miniClass: string;
	let standardClass: string;
	let mini: Variety;

	beforeAll(async () => {
		mini = (await Variety.findOne({
			where: { societyId: spring.societyId, plantGroup: 'sinningia', sizeClass: 'miniature' },
			order: [['name', 'ASC']]
		}))!;
		const division = await sequelize.query<{ id: string }>(
			'SELECT id FROM divisions WHERE show_id = $1',
			{ bind: [show.id], type: QueryTypes.SELECT }
		);
		const scale = await sequelize.query<{ scale_id: string }>(
			'SELECT scale_id FROM classes WHERE id = $1',
			{ bind: [classId], type: QueryTypes.SELECT }
		);
		[miniClass, standardClass] = [randomUUID(), randomUUID()];
		for (const [id, code, name, size, position] of [
			[miniClass, 'S1', 'Miniature Sinningia', 'miniature', 2],
			[standardClass, 'S2', 'Sinningia, standard', 'standard', 3]
		] as const) {
			await sequelize.query(
				`INSERT INTO classes (id, show_id, division_id, code, name, position, scale_id, genera, size_classes)
				 VALUES ($1, $2, $3, $4, $5, $6, $7, ARRAY['sinningia'], ARRAY[$8])`,
				{ bind: [id, show.id, division[0].id, code, name, position, scale[0].scale_id, size] }
			);
		}
	});

	const sinningia = (over: Partial<DeskEntryInput> = {}) =>
		input({
			walkInName: 'Perrin Ashgrove',
			classId: miniClass,
			varietyId: mini.id,
			diameter: 4,
			potSize: 2.5,
			...over
		});

	it('refuses a miniature Sinningia with a 3 in leaf blade, with its reason, and takes one of 2 in', async () => {
		const before = await Entry.count({ where: { showId: show.id } });
		const e = await failure(enter(sinningia({ leaf: 3 })));
		expect(e).toBeInstanceOf(DeskEntryRefused);
		const failures = (e as DeskEntryRefused).failures;
		expect(failures.map((f) => f.code)).toEqual(['leaf_over_limit']);
		expect(failures[0].message).toMatch(/leaf blades up to 2\.5 in .* measures 3 in/);
		expect(failures[0].whatToDo).toMatch(/class for its measured size.*or scratch it/);
		expect(await Entry.count({ where: { showId: show.id } })).toBe(before);

		// 5.08 cm = 2 in (1 in = 2.54 cm exactly, NIST SP 811): the society's unit or the other.
		const entered = await enter(
			sinningia({ leaf: 5.08, diameter: 10.16, potSize: 6.35, unit: 'cm' })
		);
		const entry = (await Entry.findByPk(entered.id))!;
		expect(entry.classId).toBe(miniClass);
		expect(Number(entry.measuredLeafIn)).toBe(2);
		expect(Number(entry.measuredDiameterIn)).toBe(4);
	});

	it('measured again at check-in with a 3 in leaf: the reason, and the standard class proposed', async () => {
		const entered = await enter(sinningia({ leaf: 2 }));
		const checkIn = (leaf: number | undefined) =>
			sequelize.transaction((transaction) =>
				checkInEntry(
					show,
					entered.id,
					clerk.id,
					{ diameter: 4, crowns: 1, potSize: 2.5, leaf, unit: 'in' },
					{ transaction }
				)
			);
		expect((await loadDeskEntry(show, entered.number))!.verdict!.fits).toBe(true);

		await checkIn(3);
		const desk = (await loadDeskEntry(show, entered.number))!;
		expect(desk.sizedByLeaf).toBe(true);
		expect(desk.measuredLeafIn).toBe(3);
		expect(desk.verdict!.failures.map((f) => f.code)).toEqual(['leaf_over_limit']);
		expect(desk.verdict!.failures[0].whatToDo).toMatch(/class for its measured size/);
		// Proposed: the standard Sinningia class (and the open class 1, which asks for no group).
		expect(desk.proposals.map((p) => p.id)).toContain(standardClass);
		expect(desk.proposals.map((p) => p.id)).not.toContain(miniClass);

		// A negative leaf blade: the form refuses it with a clear message, the service writes nothing.
		const parsed = checkInSchema.safeParse({
			diameter: '4',
			crowns: '1',
			potSize: '2.5',
			leaf: '-2',
			unit: 'in'
		});
		expect(parsed.success).toBe(false);
		expect(parsed.error!.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['leaf', 'The longest leaf blade must be more than 0.']
		]);
		const bad = await failure(checkIn(-2));
		expect(bad).toBeInstanceOf(RangeError);
		const tooLarge = await failure(checkIn(250));
		expect(tooLarge).toBeInstanceOf(DeskProblem);
		expect((tooLarge as Error).message).toBe('Those measurements are too large.');
		expect(Number((await Entry.findByPk(entered.id))!.measuredLeafIn)).toBe(3);

		// Measured again without the leaf: the earlier length no longer stands.
		await checkIn(undefined);
		expect((await Entry.findByPk(entered.id))!.measuredLeafIn).toBeNull();
		// A violet's group is not sized by the leaf: the desk does not ask for it.
		const violet = (await Entry.findOne({ where: { showId: show.id, classId } }))!;
		expect((await loadDeskEntry(show, violet.number))!.sizedByLeaf).toBe(false);
	});
});
