import { QueryTypes, type Transaction } from 'sequelize';
import type { IsoDate } from '../../domain/dates';
import type { DuesStanding } from '../../domain/dues';
import { ROLE_LABELS, isRole, type Role } from '../../roles';
import type { MemberQuery } from '../../schemas/members';
import { recordAudit, type AuditActor } from '../audit';
import { Membership, Society, User, sequelize } from '../db';
import { queueMail } from '../mail/outbox';
import { invitationMessage } from '../payments/payment-messages';
import { societyToday } from './society-today';
import type { PersonRow } from './people';
import { Refusal } from '../http/refusal';

/** One row of the admin's members table: a person of the society, with standing and sign-in. */
export interface MemberRow extends PersonRow {
	standing: DuesStanding;
	signedIn: boolean;
	joinedOn: string;
}

/** A page of members with the total and the count of each standing (who is current). */
export interface MemberPage {
	rows: MemberRow[];
	total: number;
	page: number;
	pageSize: number;
	counts: Record<DuesStanding, number>;
}

/** Sort keys to SQL: only these ever reach the query. */
const SORT_SQL: Record<MemberQuery['sort'], string> = {
	name: `lower(COALESCE(u.name, u.email))`,
	email: `lower(u.email)`,
	duesPaidThrough: `m.dues_paid_through`,
	joinedOn: `m.created_at`
};

/**
 * Lists a society's members for the admin, sorted and filtered in the database: text search on
 * name and e-mail, one role, a standing (on `today`), with paging; counts of each standing too.
 */
export async function listMembers(
	societyId: string,
	query: MemberQuery,
	today?: IsoDate
): Promise<MemberPage> {
	today ??= await societyToday(societyId);
	const where = ['m.society_id = :societyId'];
	const replacements: Record<string, unknown> = { societyId, today };
	if (query.q) {
		replacements.like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		where.push('(u.name ILIKE :like OR u.email ILIKE :like)');
	}
	if (query.role) {
		replacements.role = query.role;
		where.push(':role = ANY(m.roles)');
	}
	const standingSql = `CASE WHEN m.dues_paid_through IS NULL THEN 'none'
	                          WHEN m.dues_paid_through >= CAST(:today AS date) THEN 'current' ELSE 'lapsed' END`;
	const filtered = [...where];
	if (query.standing) {
		replacements.standing = query.standing;
		filtered.push(`${standingSql} = :standing`);
	}
	const direction = query.dir === 'desc' ? 'DESC' : 'ASC';
	const order = `${SORT_SQL[query.sort]} ${direction} NULLS LAST, lower(u.email) ASC`;
	const offset = (query.page - 1) * query.pageSize;
	const rows = await sequelize.query<{
		user_id: string;
		name: string | null;
		email: string;
		roles: string[];
		household: string | null;
		dues_paid_through: string | null;
		signed_in: boolean;
		joined_on: string;
		standing: DuesStanding;
		total: string;
	}>(
		`SELECT u.id AS user_id, u.name, u.email, m.roles, m.household,
		        to_char(m.dues_paid_through, 'YYYY-MM-DD') AS dues_paid_through,
		        (u.email_verified IS NOT NULL) AS signed_in,
		        to_char(m.created_at, 'YYYY-MM-DD') AS joined_on,
		        ${standingSql} AS standing,
		        count(*) OVER () AS total
		   FROM memberships m JOIN users u ON u.id = m.user_id
		  WHERE ${filtered.join(' AND ')}
		  ORDER BY ${order}
		  LIMIT ${query.pageSize} OFFSET ${offset}`,
		{ replacements, type: QueryTypes.SELECT }
	);
	const countRows = await sequelize.query<{ standing: DuesStanding; n: string }>(
		`SELECT ${standingSql} AS standing, count(*) AS n
		   FROM memberships m JOIN users u ON u.id = m.user_id
		  WHERE ${where.join(' AND ')} AND 'member' = ANY(m.roles)
		  GROUP BY 1`,
		{ replacements, type: QueryTypes.SELECT }
	);
	const counts: Record<DuesStanding, number> = { current: 0, lapsed: 0, none: 0 };
	for (const c of countRows) counts[c.standing] = Number(c.n);
	return {
		rows: rows.map((r) => ({
			userId: r.user_id,
			name: r.name,
			email: r.email,
			roles: r.roles.filter(isRole),
			household: r.household,
			duesPaidThrough: r.dues_paid_through,
			standing: r.standing,
			signedIn: r.signed_in,
			joinedOn: r.joined_on
		})),
		total: rows.length ? Number(rows[0].total) : 0,
		page: query.page,
		pageSize: query.pageSize,
		counts
	};
}

/** A change that needs a person's word first, or cannot be made; the message is for the admin. */
export class MemberChangeError extends Refusal {
	constructor(message: string, field?: string) {
		super(message, 400, field);
	}
}

/**
 * Invites an address into the society with the given roles. The roles hold at once (the account
 * is created if new), and an invitation with a sign-in link goes out through the outbox in the
 * same transaction. An address already in the society is refused: change its roles instead.
 */
export async function inviteMember(
	input: {
		societyId: string;
		email: string;
		name?: string | null;
		roles: Role[];
		invitedBy: string;
		origin: string;
	},
	options: { transaction: Transaction }
): Promise<{ userId: string; email: string }> {
	const { transaction } = options;
	const email = input.email.trim().toLowerCase();
	const society = await Society.findByPk(input.societyId, { transaction });
	if (!society) throw new MemberChangeError('That society does not exist.');
	const [user] = await User.findOrCreate({
		where: { email },
		defaults: { email, name: input.name || null, emailVerified: null, image: null },
		transaction
	});
	if (input.name && !user.name) await user.update({ name: input.name }, { transaction });
	const existing = await Membership.findOne({
		where: { societyId: society.id, userId: user.id },
		transaction
	});
	if (existing) {
		throw new MemberChangeError(
			`${email} is already in ${society.name}. Change their roles in the table instead.`,
			'email'
		);
	}
	const roles = [...new Set(input.roles)].sort();
	await Membership.create(
		{ societyId: society.id, userId: user.id, roles, household: null, duesPaidThrough: null },
		{ transaction }
	);
	const message = invitationMessage({
		societyName: society.name,
		invitedBy: input.invitedBy,
		roles: roles.map((r) => ROLE_LABELS[r]),
		signInUrl: `${input.origin}/signin`
	});
	await queueMail(
		[
			{
				kind: 'invitation',
				to: email,
				societyId: society.id,
				recipientId: user.id,
				dedupeKey: null,
				...message
			}
		],
		{ transaction }
	);
	return { userId: user.id, email };
}

/**
 * Sets a member's roles. Taking a role away needs `confirmed` (the page asks first); the last
 * society admin cannot lose the admin role, so a society is never left without one. Every change
 * is audited in the same transaction. Returns the roles taken away and given.
 */
export async function changeMemberRoles(
	input: { societyId: string; userId: string; roles: Role[]; confirmed: boolean },
	options: { transaction: Transaction; actor: AuditActor }
): Promise<{ removed: Role[]; added: Role[]; roles: Role[] }> {
	const { transaction } = options;
	const membership = await Membership.findOne({
		where: { societyId: input.societyId, userId: input.userId },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (!membership) throw new MemberChangeError('That person is not in this society.');
	const before = membership.roles.filter(isRole);
	const roles = [...new Set(input.roles)].sort();
	const removed = before.filter((r) => !roles.includes(r));
	const added = roles.filter((r) => !before.includes(r));
	if (removed.length && !input.confirmed) {
		throw new MemberChangeError(
			`Confirm that you are taking away: ${removed.map((r) => ROLE_LABELS[r]).join(', ')}.`,
			'confirm'
		);
	}
	if (removed.includes('admin')) {
		const [row] = await sequelize.query<{ n: string }>(
			`SELECT count(*) AS n FROM memberships
			  WHERE society_id = :societyId AND 'admin' = ANY(roles) AND user_id <> :userId`,
			{
				replacements: { societyId: input.societyId, userId: input.userId },
				type: QueryTypes.SELECT,
				transaction
			}
		);
		if (Number(row.n) === 0) {
			throw new MemberChangeError(
				'This is the only society admin. Make someone else an admin first.',
				'roles'
			);
		}
	}
	await membership.update({ roles }, { transaction });
	if (removed.length || added.length) {
		const person = await User.findByPk(input.userId, {
			attributes: ['name', 'email'],
			transaction
		});
		await recordAudit(
			{
				societyId: input.societyId,
				actor: options.actor,
				action: 'roles.change',
				target: { kind: 'person', id: input.userId, label: person?.name ?? person?.email ?? '' },
				details: { before: { roles: before }, after: { roles }, removed, added }
			},
			{ transaction }
		);
	}
	return { removed, added, roles };
}
