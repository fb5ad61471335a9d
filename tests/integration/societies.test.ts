import { defaultScales } from '../../src/lib/domain/scales';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { DEFAULT_AWARD_RULES } from '$lib/domain/awards';
import { startSocietySchema, type SocietyFields } from '$lib/schemas/society';
import { Membership, Scale, Society, User, sequelize } from '$lib/server/db';
import {
	SIGNUP_CLOSED_MESSAGE,
	SocietyError,
	startSociety,
	updateSocietySettings
} from '$lib/server/people/societies';

import { actions, load } from '../../src/routes/societies/new/+page.server';
import { useConfig } from '$lib/server/config';

const run = promisify(execFile);
const stamp = Date.now().toString(36);
const slugs: string[] = [];
const emails: string[] = [];

/** A society's fields with a short name no other test uses. */
function fields(overrides: Partial<SocietyFields> = {}): SocietyFields {
	const slug = `fern-hollow-${stamp}-${slugs.length}`;
	slugs.push(slug);
	return {
		name: 'Fern Hollow Gesneriad Circle',
		slug,
		country: 'CA',
		unit: 'cm',
		paperSize: 'a4',
		timeZone: 'America/Toronto',
		currency: 'CAD',
		...overrides
	};
}

async function founder(): Promise<User> {
	const email = `founder-${stamp}-${emails.length}@example.org`;
	emails.push(email);
	return User.create({ email, name: null, emailVerified: null, image: null });
}

/** Rows of every table a start writes to, to show that a refusal wrote nothing. */
async function counts(): Promise<Record<string, number>> {
	const out: Record<string, number> = {};
	for (const table of ['societies', 'memberships', 'scales', 'users', 'shows', 'varieties']) {
		const [row] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, {
			type: QueryTypes.SELECT
		});
		out[table] = Number(row.n);
	}
	return out;
}

afterAll(async () => {
	await Society.destroy({ where: { slug: slugs } });
	await User.destroy({ where: { email: emails } });
	await sequelize.close();
});

describe('starting a society through the service', () => {
	it('makes the founder its admin and member, with its own scales and award rules and nothing else', async () => {
		const person = await founder();
		const input = fields();
		const started = await sequelize.transaction((transaction) =>
			startSociety(
				{ ...input, founder: { userId: person.id } },
				{ transaction, startedBy: 'person', signup: 'open' }
			)
		);
		const society = (await Society.findByPk(started.society.id))!;
		expect(society.get({ plain: true })).toMatchObject({
			name: input.name,
			slug: input.slug,
			country: 'CA',
			lengthUnit: 'cm',
			paperSize: 'a4',
			timeZone: 'America/Toronto',
			currency: 'CAD'
		});
		const membership = await Membership.findAll({ where: { societyId: society.id } });
		expect(membership.map((m) => [m.userId, [...m.roles].sort()])).toEqual([
			[person.id, ['admin', 'member']]
		]);
		expect(started.admin).toEqual({ id: person.id, email: person.email, created: false });

		// The default scale: "A Beginner's Guide to Judging", African Violet Magazine, May/June
		// 1993, rev. 2020 (symmetry or leaf pattern 25, condition 25, quantity of bloom 25, size and
		// type of blossom 15, color of blossom 10).
		// Each default scale comes as the society's own copy, the published one first.
		const scales = await Scale.findAll({
			where: { societyId: society.id },
			order: [['createdAt', 'ASC']]
		});
		expect(scales.map((s) => s.name).sort()).toEqual(
			defaultScales()
				.map((d) => d.name)
				.sort()
		);
		const standard = scales.find((s) => s.name === defaultScales()[0].name)!;
		expect(standard.criteria.map((c) => c.maxPoints)).toEqual([25, 25, 25, 15, 10]);
		// An editable copy: changing it leaves every other society's scales as they were.
		const shared = await Scale.count({ where: { societyId: null } });
		await standard.update({ name: 'Our standard scale' });
		expect(await Scale.count({ where: { societyId: null } })).toBe(shared);

		// Award rules: the defaults (merit ribbons blue 90, red 80, white 70, from memory of the
		// national handbook, DOMAIN.md), stored for the society's new shows.
		expect(society.defaultAwardRules).toEqual(JSON.parse(JSON.stringify(DEFAULT_AWARD_RULES)));
		expect(society.defaultAwardRules).toMatchObject({ merit: { blue: 90, red: 80, white: 70 } });

		for (const table of ['shows', 'varieties', 'dues_periods']) {
			const [row] = await sequelize.query<{ n: string }>(
				`SELECT count(*) AS n FROM ${table} WHERE society_id = $1`,
				{ bind: [society.id], type: QueryTypes.SELECT }
			);
			expect(Number(row.n), table).toBe(0);
		}
	});

	it('refuses a short name another society has, and bad settings, writing nothing', async () => {
		const person = await founder();
		const before = await counts();
		const taken = fields({ slug: 'larkspur-valley' });
		await expect(
			sequelize.transaction((transaction) =>
				startSociety(
					{ ...taken, founder: { userId: person.id } },
					{ transaction, startedBy: 'person', signup: 'open' }
				)
			)
		).rejects.toThrow(/already taken/);
		await expect(
			sequelize.transaction((transaction) =>
				startSociety(
					{ ...taken, founder: { email: `never-${stamp}@example.org` } },
					{ transaction, startedBy: 'operator' }
				)
			)
		).rejects.toBeInstanceOf(SocietyError);

		// The schema refuses each bad setting before any service runs.
		const bad: [string, Record<string, unknown>][] = [
			['timeZone', { timeZone: 'Mars/Olympus_Mons' }],
			['unit', { unit: 'furlong' }],
			['paperSize', { paperSize: 'legal' }],
			['currency', { currency: 'XYZ' }],
			['country', { country: 'ZZ' }],
			['slug', { slug: 'Upper Case!' }],
			['slug', { slug: '-edge-' }],
			['name', { name: 'x\u0000y' }]
		];
		for (const [field, change] of bad) {
			const parsed = startSocietySchema.safeParse({ ...fields(), ...change });
			expect(parsed.success, field).toBe(false);
			expect(parsed.error?.issues[0].path[0], field).toBe(field);
		}
		expect(await counts()).toEqual(before);
	});

	it('refuses a person when signup is closed (403), but not the operator', async () => {
		const person = await founder();
		const before = await counts();
		const input = fields();
		const refusal = await sequelize
			.transaction((transaction) =>
				startSociety(
					{ ...input, founder: { userId: person.id } },
					{ transaction, startedBy: 'person', signup: 'closed' }
				)
			)
			.catch((err: unknown) => err);
		expect(refusal).toBeInstanceOf(SocietyError);
		expect((refusal as SocietyError).status).toBe(403);
		expect((refusal as SocietyError).message).toBe(SIGNUP_CLOSED_MESSAGE);
		expect(await counts()).toEqual(before);

		const email = `operator-made-${stamp}@example.org`;
		emails.push(email);
		const started = await sequelize.transaction((transaction) =>
			startSociety(
				{ ...input, founder: { email } },
				{ transaction, startedBy: 'operator', signup: 'closed' }
			)
		);
		expect(started.admin).toMatchObject({ email, created: true });
	});

	it('lets the admin change the settings; a short name already taken is refused', async () => {
		const person = await founder();
		const input = fields();
		const started = await sequelize.transaction((transaction) =>
			startSociety(
				{ ...input, founder: { userId: person.id } },
				{ transaction, startedBy: 'person', signup: 'open' }
			)
		);
		const renamed = fields({ unit: 'in', paperSize: 'letter', timeZone: 'Europe/London' });
		await sequelize.transaction((transaction) =>
			updateSocietySettings({ ...renamed, societyId: started.society.id }, { transaction })
		);
		const saved = (await Society.findByPk(started.society.id))!;
		expect([saved.slug, saved.lengthUnit, saved.paperSize, saved.timeZone]).toEqual([
			renamed.slug,
			'in',
			'letter',
			'Europe/London'
		]);
		await expect(
			sequelize.transaction((transaction) =>
				updateSocietySettings(
					{ ...renamed, slug: 'larkspur-valley', societyId: started.society.id },
					{ transaction }
				)
			)
		).rejects.toThrow(/already taken/);
		expect((await Society.findByPk(started.society.id))!.slug).toBe(renamed.slug);
	});
});

describe('the start page on a closed host (CB_SOCIETY_SIGNUP unset)', () => {
	it('says so, and its action answers 403 writing nothing', async () => {
		// Settings are read once at start: this host starts with the variable unset.
		useConfig({ ...process.env, CB_SOCIETY_SIGNUP: undefined });
		try {
			const person = await founder();
			const user = { id: person.id, email: person.email, name: null, memberships: [] };
			const url = new URL('http://127.0.0.1/societies/new');
			const page = (await load({ locals: { user }, url } as never)) as { open: boolean };
			expect(page.open).toBe(false);

			const form = new FormData();
			for (const [k, v] of Object.entries(fields())) form.set(k, v);
			const before = await counts();
			const request = new Request(url, { method: 'POST', body: form });
			const answer = (await actions.default({ locals: { user }, url, request } as never)) as {
				status: number;
				data: { message: string };
			};
			expect(answer.status).toBe(403);
			expect(answer.data.message).toBe(SIGNUP_CLOSED_MESSAGE);
			expect(await counts()).toEqual(before);
		} finally {
			useConfig(process.env);
		}
	});
});

describe('npm run society -- create (the command line)', () => {
	const cli = (args: string[]) =>
		run('node_modules/.bin/tsx', ['scripts/society.ts', ...args], { env: process.env }).then(
			(r) => ({ code: 0, ...r }),
			(err: { code: number; stdout: string; stderr: string }) => err
		);

	it('starts a society and creates its admin, printing how they sign in', async () => {
		const slug = `cli-violets-${stamp}`;
		slugs.push(slug);
		const email = `cli-admin-${stamp}@example.org`;
		emails.push(email);
		const result = await cli([
			'create',
			'--name',
			'Riverbend Violet Club',
			'--slug',
			slug,
			'--admin',
			email.toUpperCase(),
			'--country',
			'US',
			'--unit',
			'in',
			'--paper',
			'letter',
			'--time-zone',
			'America/Chicago',
			'--currency',
			'USD'
		]);
		expect(result.code).toBe(0);
		expect(result.stdout).toContain(`Started Riverbend Violet Club (short name ${slug})`);
		expect(result.stdout).toContain(`${email} (new account)`);
		expect(result.stdout).toMatch(/\/signin/);
		const society = (await Society.findOne({ where: { slug } }))!;
		expect(society.timeZone).toBe('America/Chicago');
		const admin = (await User.findOne({ where: { email } }))!;
		const membership = (await Membership.findOne({
			where: { societyId: society.id, userId: admin.id }
		}))!;
		expect([...membership.roles].sort()).toEqual(['admin', 'member']);
		expect(await Scale.count({ where: { societyId: society.id } })).toBe(defaultScales().length);
	});

	it.each([
		['a short name already taken', ['--slug', 'larkspur-valley'], /already taken/],
		['a bad e-mail address', ['--admin', 'not-an-address'], /--admin needs a complete e-mail/],
		['an unknown unit', ['--unit', 'furlong'], /--unit: Choose inches/],
		['an unknown time zone', ['--time-zone', 'Nowhere/Else'], /--time-zone: Choose a time zone/],
		['an unknown option', ['--colour', 'blue'], /Unknown option '--colour'/]
	])('refuses %s with a message and exit code 2, writing nothing', async (_, change, message) => {
		const base: Record<string, string> = {
			'--name': 'Never Started Society',
			'--slug': `never-${stamp}`,
			'--admin': `never-admin-${stamp}@example.org`
		};
		const args = ['create'];
		for (const [k, v] of Object.entries(base)) if (!change.includes(k)) args.push(k, v);
		args.push(...change);
		const before = await counts();
		const result = await cli(args);
		expect(result.code).toBe(2);
		expect(result.stderr).toMatch(message);
		expect(await counts()).toEqual(before);
	});
});
