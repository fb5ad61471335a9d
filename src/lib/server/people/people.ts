import { QueryTypes } from 'sequelize';
import { isRole, type Role } from '$lib/roles';
import { Membership, Society, User, sequelize } from '../db';

/** Loads the signed-in person with every society they belong to and their roles there. */
export async function loadSignedInUser(userId: string): Promise<App.SignedInUser | null> {
	const user = await User.findByPk(userId, {
		include: [
			{ model: Membership, as: 'memberships', include: [{ model: Society, as: 'society' }] }
		]
	});
	if (!user) return null;
	const memberships = (user.get('memberships') as (Membership & { society: Society })[]) ?? [];
	return {
		id: user.id,
		email: user.email,
		name: user.name,
		memberships: memberships
			.map((m) => ({
				societyId: m.society.id,
				societySlug: m.society.slug,
				societyName: m.society.name,
				roles: m.roles.filter(isRole)
			}))
			.sort((a, b) => a.societyName.localeCompare(b.societyName))
	};
}

/** The person of a session with each of their societies and roles (one row per society). */
const SESSION_USER = `SELECT s.expires, u.id, u.email, u.name, m.roles,
	        so.id AS society_id, so.slug AS society_slug, so.name AS society_name
	   FROM sessions s
	   JOIN users u ON u.id = s.user_id
	   LEFT JOIN memberships m ON m.user_id = u.id
	   LEFT JOIN societies so ON so.id = m.society_id
	  WHERE s.session_token = :sessionToken AND s.expires > now()`;

/**
 * The person behind a database session token, with their societies and roles, in one query (the
 * path of every signed-in request). Returns null for
 * an unknown or expired session, and `due: true` when the session has reached the age at which
 * Auth.js extends it (the caller then goes through Auth.js, which does that).
 */
export async function loadSessionUser(
	sessionToken: string,
	rolling: { maxAgeSeconds: number; updateAgeSeconds: number }
): Promise<{ user: App.SignedInUser; due: boolean } | null> {
	const rows = await sequelize.query<{
		expires: Date;
		id: string;
		email: string;
		name: string | null;
		roles: string[] | null;
		society_id: string | null;
		society_slug: string | null;
		society_name: string | null;
	}>(SESSION_USER, { replacements: { sessionToken }, type: QueryTypes.SELECT });
	if (rows.length === 0) return null;
	const first = rows[0];
	const dueAt =
		first.expires.getTime() - rolling.maxAgeSeconds * 1000 + rolling.updateAgeSeconds * 1000;
	return {
		due: dueAt <= Date.now(),
		user: {
			id: first.id,
			email: first.email,
			name: first.name,
			memberships: rows
				.filter((r) => r.society_id !== null)
				.map((r) => ({
					societyId: r.society_id as string,
					societySlug: r.society_slug as string,
					societyName: r.society_name as string,
					roles: (r.roles ?? []).filter(isRole)
				}))
				.sort((a, b) => a.societyName.localeCompare(b.societyName))
		}
	};
}

/** One row of a society's people list. */
export interface PersonRow {
	userId: string;
	name: string | null;
	email: string;
	roles: Role[];
	household: string | null;
	duesPaidThrough: string | null;
}
