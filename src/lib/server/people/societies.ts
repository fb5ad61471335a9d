import { Op, UniqueConstraintError, type Transaction } from 'sequelize';
import { DEFAULT_AWARD_RULES } from '../../domain/awards';
import { defaultScales } from '../../domain/scales';
import type { SocietyFields } from '../../schemas/society';
import { societySignup, type SocietySignup } from '../config';
import { Membership, Scale, Society, User } from '../db';
import { Refusal } from '../http/refusal';

/** Why a society could not be started or changed; the message is for the person, 403 or 400. */
export class SocietyError extends Refusal {
	declare readonly field?: keyof SocietyFields;
	declare readonly status: 400 | 403;
	constructor(message: string, field?: keyof SocietyFields, status: 400 | 403 = 400) {
		super(message, status, field);
	}
}

/** What a person reads when only the host's operator may start societies. */
export const SIGNUP_CLOSED_MESSAGE =
	'On this Crownbench, new societies are started by the people who run it. Ask them to start yours: they can make you its society admin.';

const slugTakenMessage = (slug: string) =>
	`The short name “${slug}” is already taken by another society. Choose another one.`;

/** The person who starts a society: a signed-in account, or an address (the CLI creates it). */
export type Founder = { userId: string } | { email: string; name?: string | null };

/** A society just started, with its first admin. */
export interface StartedSociety {
	society: { id: string; name: string; slug: string };
	admin: { id: string; email: string; created: boolean };
	scales: { id: string; name: string }[];
}

async function refuseTakenSlug(
	slug: string,
	options: { transaction: Transaction; exceptId?: string }
): Promise<void> {
	const taken = await Society.findOne({
		where: { slug, ...(options.exceptId ? { id: { [Op.ne]: options.exceptId } } : {}) },
		attributes: ['id'],
		transaction: options.transaction
	});
	if (taken) throw new SocietyError(slugTakenMessage(slug), 'slug');
}

/** A unique-index clash on the short name (two starts at once) as the same clear refusal. */
function asSlugTaken(err: unknown, slug: string): unknown {
	return err instanceof UniqueConstraintError
		? new SocietyError(slugTakenMessage(slug), 'slug')
		: err;
}

/**
 * Starts a society: the society with its settings, its founder as society admin and member, and
 * its own editable copies of the default scales of points and award rules (never any people,
 * varieties or shows). A person may start one only when the host's signup is open; the host's
 * operator (the command line) always may. All writes in the caller's transaction.
 */
export async function startSociety(
	input: SocietyFields & { founder: Founder },
	options: { transaction: Transaction; startedBy: 'person' | 'operator'; signup?: SocietySignup }
): Promise<StartedSociety> {
	const { transaction } = options;
	if (options.startedBy === 'person' && (options.signup ?? societySignup()) !== 'open') {
		throw new SocietyError(SIGNUP_CLOSED_MESSAGE, undefined, 403);
	}
	await refuseTakenSlug(input.slug, { transaction });

	let user: User | null;
	let created = false;
	if ('userId' in input.founder) {
		user = await User.findByPk(input.founder.userId, { transaction });
		if (!user) throw new SocietyError('Sign in again: your account was not found.', undefined, 403);
	} else {
		const email = input.founder.email.trim().toLowerCase();
		[user, created] = await User.findOrCreate({
			where: { email },
			defaults: { email, name: input.founder.name || null, emailVerified: null, image: null },
			transaction
		});
	}

	let society: Society;
	try {
		society = await Society.create(
			{
				name: input.name,
				slug: input.slug,
				country: input.country,
				lengthUnit: input.unit,
				paperSize: input.paperSize,
				timeZone: input.timeZone,
				currency: input.currency,
				defaultAwardRules: structuredClone(DEFAULT_AWARD_RULES) as unknown as Record<
					string,
					unknown
				>
			},
			{ transaction }
		);
	} catch (err) {
		throw asSlugTaken(err, input.slug);
	}
	await Membership.create(
		{
			societyId: society.id,
			userId: user.id,
			roles: ['admin', 'member'],
			household: null,
			duesPaidThrough: null
		},
		{ transaction }
	);
	const scales = await Scale.bulkCreate(
		defaultScales().map((s) => ({ societyId: society.id, name: s.name, criteria: s.criteria })),
		{ transaction, returning: true }
	);
	return {
		society: { id: society.id, name: society.name, slug: society.slug },
		admin: { id: user.id, email: user.email, created },
		scales: scales.map((s) => ({ id: s.id, name: s.name }))
	};
}

/** The society's name, short name and settings, as its settings form shows them. */
export async function loadSocietyFields(
	societyId: string,
	options: { transaction?: Transaction } = {}
): Promise<SocietyFields | null> {
	const s = await Society.findByPk(societyId, { transaction: options.transaction });
	if (!s) return null;
	return {
		name: s.name,
		slug: s.slug,
		country: s.country,
		unit: s.lengthUnit,
		paperSize: s.paperSize,
		timeZone: s.timeZone,
		currency: s.currency as SocietyFields['currency']
	};
}

/**
 * Saves a society's name, short name and settings (the admin's settings page). A short name
 * another society holds is refused. Returns the saved values.
 */
export async function updateSocietySettings(
	input: SocietyFields & { societyId: string },
	options: { transaction: Transaction }
): Promise<SocietyFields> {
	const { transaction } = options;
	const society = await Society.findByPk(input.societyId, {
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (!society) throw new SocietyError('That society does not exist.', undefined, 403);
	await refuseTakenSlug(input.slug, { transaction, exceptId: society.id });
	try {
		await society.update(
			{
				name: input.name,
				slug: input.slug,
				country: input.country,
				lengthUnit: input.unit,
				paperSize: input.paperSize,
				timeZone: input.timeZone,
				currency: input.currency,
				updatedAt: new Date()
			},
			{ transaction }
		);
	} catch (err) {
		throw asSlugTaken(err, input.slug);
	}
	const { societyId: _ignored, ...fields } = input;
	return fields;
}
