import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { Membership, Society, User, sequelize } from '$lib/server/db';
import { memberQuerySchema } from '$lib/schemas/members';
import {
	MemberChangeError,
	changeMemberRoles,
	inviteMember,
	listMembers
} from '$lib/server/people/members';

const query = (q: Record<string, unknown> = {}) => memberQuerySchema.parse(q);
const today = '2027-01-15';
let society: Society;
const invited: string[] = [];

beforeAll(async () => {
	society = (await Society.findOne({ where: { slug: 'larkspur-valley' } }))!;
});

afterAll(async () => {
	await User.destroy({ where: { email: invited } });
	// Messages queued here must not wait in the outbox for another test's sender.
	await sequelize.query(`DELETE FROM outbox_messages WHERE kind = 'invitation'`);
	await sequelize.close();
});

describe('members list (sorted and filtered in the database)', () => {
	it('sorts by name both ways, and by dues date with people without dues last', async () => {
		const up = await listMembers(society.id, query({ sort: 'name', pageSize: 200 }), today);
		const names = up.rows.map((r) => (r.name ?? r.email).toLowerCase());
		expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)));
		const down = await listMembers(
			society.id,
			query({ sort: 'name', dir: 'desc', pageSize: 200 }),
			today
		);
		expect(down.rows.map((r) => r.userId)).toEqual(up.rows.map((r) => r.userId).reverse());

		const byDues = await listMembers(
			society.id,
			query({ sort: 'duesPaidThrough', pageSize: 200 }),
			today
		);
		const dates = byDues.rows.map((r) => r.duesPaidThrough);
		const withDates = dates.filter((d): d is string => d !== null);
		expect(withDates).toEqual([...withDates].sort());
		expect(dates.slice(withDates.length).every((d) => d === null)).toBe(true);
	});

	it('filters by standing, role and text, and counts who is current', async () => {
		// The demo seed: lapsed@ paid through four months before the seed ran; judges 1 and 2 pay no dues.
		const seedDay = new Date().toISOString().slice(0, 10);
		const lapsed = await listMembers(society.id, query({ standing: 'lapsed' }), seedDay);
		expect(lapsed.rows.map((r) => r.email)).toContain('lapsed@crownbench.test');
		expect(lapsed.rows.every((r) => r.standing === 'lapsed')).toBe(true);

		const none = await listMembers(society.id, query({ standing: 'none' }), seedDay);
		expect(none.rows.map((r) => r.email).sort()).toEqual(
			expect.arrayContaining(['judge1@crownbench.test', 'judge2@crownbench.test'])
		);

		const judges = await listMembers(society.id, query({ role: 'judge' }), seedDay);
		expect(judges.rows.every((r) => r.roles.includes('judge'))).toBe(true);
		expect(judges.total).toBeGreaterThanOrEqual(3);

		const text = await listMembers(society.id, query({ q: 'PELLIC' }), seedDay);
		expect(text.rows.map((r) => r.email)).toEqual(['lapsed@crownbench.test']);
		// LIKE wildcards typed by a person are taken literally.
		expect((await listMembers(society.id, query({ q: '%' }), seedDay)).total).toBe(0);

		const all = await listMembers(society.id, query(), seedDay);
		expect(all.counts.lapsed).toBeGreaterThanOrEqual(1);
		expect(all.counts.current).toBeGreaterThanOrEqual(10);
	});

	it('pages through the list', async () => {
		const first = await listMembers(society.id, query({ pageSize: 5, page: 1 }), today);
		const second = await listMembers(society.id, query({ pageSize: 5, page: 2 }), today);
		expect(first.rows).toHaveLength(5);
		expect(first.total).toBe(second.total);
		const ids = new Set(first.rows.map((r) => r.userId));
		expect(second.rows.some((r) => ids.has(r.userId))).toBe(false);
	});

	it('refuses unknown sort columns and filters before any query', () => {
		expect(memberQuerySchema.safeParse({ sort: 'password' }).success).toBe(false);
		expect(memberQuerySchema.safeParse({ standing: 'gold' }).success).toBe(false);
		expect(memberQuerySchema.safeParse({ pageSize: '100000' }).success).toBe(false);
	});
});

describe('invitations and roles', () => {
	it('an invitation gives the roles at once and queues one message with a sign-in link', async () => {
		const email = `Invitee-${Date.now()}@Crownbench.test`;
		invited.push(email.toLowerCase());
		const result = await sequelize.transaction((transaction) =>
			inviteMember(
				{
					societyId: society.id,
					email,
					name: 'Nell Invited',
					roles: ['member', 'clerk'],
					invitedBy: 'Rosalind Achterberg',
					origin: 'https://club.example'
				},
				{ transaction }
			)
		);
		expect(result.email).toBe(email.toLowerCase());
		const membership = await Membership.findOne({
			where: { societyId: society.id, userId: result.userId }
		});
		expect(membership?.roles).toEqual(['clerk', 'member']);
		const mail = await sequelize.query<{ subject: string; text_body: string }>(
			`SELECT subject, text_body FROM outbox_messages WHERE kind = 'invitation' AND to_address = $1`,
			{ bind: [email.toLowerCase()], type: QueryTypes.SELECT }
		);
		expect(mail).toHaveLength(1);
		expect(mail[0].text_body).toContain('https://club.example/signin');

		await expect(
			sequelize.transaction((transaction) =>
				inviteMember(
					{
						societyId: society.id,
						email,
						roles: ['member'],
						invitedBy: 'x',
						origin: 'https://club.example'
					},
					{ transaction }
				)
			)
		).rejects.toThrow('already in');
	});

	it('taking a role away needs confirmation; the last admin keeps the admin role', async () => {
		const email = `roles-${Date.now()}@crownbench.test`;
		invited.push(email);
		const { userId } = await sequelize.transaction((transaction) =>
			inviteMember(
				{
					societyId: society.id,
					email,
					roles: ['member', 'judge'],
					invitedBy: 'x',
					origin: 'https://club.example'
				},
				{ transaction }
			)
		);
		const change = (roles: ('member' | 'judge' | 'admin')[], confirmed: boolean) =>
			sequelize.transaction((transaction) =>
				changeMemberRoles(
					{ societyId: society.id, userId, roles, confirmed },
					{ transaction, actor: { id: userId } }
				)
			);
		await expect(change(['member'], false)).rejects.toBeInstanceOf(MemberChangeError);
		expect((await Membership.findOne({ where: { userId } }))?.roles).toEqual(['judge', 'member']);
		// Adding a role needs no confirmation.
		expect((await change(['member', 'judge', 'admin'], false)).added).toEqual(['admin']);
		expect((await change(['member'], true)).removed).toEqual(['admin', 'judge']);

		const admin = (await User.findOne({ where: { email: 'admin@crownbench.test' } }))!;
		await expect(
			sequelize.transaction((transaction) =>
				changeMemberRoles(
					{ societyId: society.id, userId: admin.id, roles: ['member'], confirmed: true },
					{ transaction, actor: admin }
				)
			)
		).rejects.toThrow('only society admin');
	});
});
