import { QueryTypes, type Transaction } from 'sequelize';
import { GROWING_CAUTION_LINE } from '$lib/cautions';
import {
	addCalendarDays,
	compareIsoDates,
	formatDateLong,
	isOnOrBetween,
	type IsoDate
} from '$lib/domain/dates';
import { config } from '../config';
import { sequelize } from '../db';
import { escapeHtml } from '../mail/escape';
import { queueMail, type QueuedMail } from '../mail/outbox';
import { societyToday } from '../people/society-today';
import {
	assessCollections,
	loadShowForReadiness,
	type PlantAssessment,
	type ShowForReadiness
} from './readiness';

/** The outbox kind of these messages. */
export const REMINDER_KIND = 'entry-reminder';

/** Reminders go out when entries close within this many days. */
export const REMINDER_DAYS_BEFORE_CLOSE = 7;

function appOrigin(): string {
	return (config().origin ?? 'http://localhost:3000').replace(/\/$/, '');
}

/** The plants worth a reminder: those that can still be entered, not yet entered. */
function plantsToRemind(plants: PlantAssessment[]): PlantAssessment[] {
	return plants.filter(
		(p) => !p.entry && (p.readiness.status === 'ready' || p.readiness.status === 'needs_work')
	);
}

/** The reminder to one member: their plants that fit, each with its classes and what it needs. */
export function buildReminder(
	show: ShowForReadiness,
	person: { name: string | null },
	plants: PlantAssessment[]
): { subject: string; text: string; html: string } {
	const origin = appOrigin();
	const classLabel = (id: string) => {
		const c = show.classes.find((k) => k.id === id);
		return c ? `class ${c.code} (${c.name})` : 'a class';
	};
	const lines = plants.map((p) => {
		const classes = p.readiness.matches
			.filter((m) => m.canEnter)
			.map((m) => classLabel(m.classId))
			.join('; ');
		const needs = p.readiness.needs.map((n) => n.message);
		return {
			plant: p.name,
			classes,
			needs: needs.length > 0 ? needs : ['Nothing more: it is ready to enter.']
		};
	});
	const closes = formatDateLong(show.context.entriesClose);
	const subject = `Entries for ${show.name} close on ${closes}`;
	const link = `${origin}/my/plants/readiness?show=${show.id}`;
	const settings = `${origin}/my/mail`;
	const hello = person.name ? `Hello ${person.name},` : 'Hello,';
	const text = [
		hello,
		'',
		`Entries for ${show.name} (${show.societyName}) close on ${closes}. These plants of your collection fit its classes:`,
		'',
		...lines.flatMap((l) => [
			`- ${l.plant}: ${l.classes}`,
			...l.needs.map((n) => `    still needs: ${n}`)
		]),
		'',
		`Enter them here: ${link}`,
		'',
		GROWING_CAUTION_LINE,
		'',
		`You get this because entry reminders are on. Turn them off at ${settings}`
	].join('\n');
	const html = `<!doctype html><html><body style="font-family: sans-serif; color: #1f2a24">
<p>${escapeHtml(hello)}</p>
<p>Entries for ${escapeHtml(show.name)} (${escapeHtml(show.societyName)}) close on <strong>${escapeHtml(closes)}</strong>. These plants of your collection fit its classes:</p>
<ul>${lines
		.map(
			(l) =>
				`<li><strong>${escapeHtml(l.plant)}</strong>: ${escapeHtml(l.classes)}<ul>${l.needs
					.map((n) => `<li>${escapeHtml(n)}</li>`)
					.join('')}</ul></li>`
		)
		.join('')}</ul>
<p><a href="${escapeHtml(link)}">Enter your plants</a></p>
<p style="font-size:14px">${escapeHtml(GROWING_CAUTION_LINE)}</p>
<p style="font-size:14px">You get this because entry reminders are on. <a href="${escapeHtml(settings)}">Turn them off</a>.</p>
</body></html>`;
	return { subject, text, html };
}

/**
 * Queues one reminder per member of the show's society who has plants that fit its classes and
 * have not been entered yet, unless they turned reminders off. The dedupe key (show and member)
 * means a member never gets the same show's reminder twice, however often this runs. Returns
 * how many messages were new.
 */
export async function queueEntryReminders(
	showId: string,
	options: { transaction: Transaction; today: IsoDate }
): Promise<number> {
	const { transaction, today } = options;
	const show = await loadShowForReadiness(showId, today, transaction);
	if (!show) return 0;
	const people = await sequelize.query<{ id: string; email: string; name: string | null }>(
		`SELECT u.id, u.email, u.name FROM memberships m
		   JOIN users u ON u.id = m.user_id
		   LEFT JOIN mail_preferences mp ON mp.user_id = u.id
		  WHERE m.society_id = :societyId AND 'member' = ANY(m.roles) AND COALESCE(mp.reminders, true)`,
		{ replacements: { societyId: show.societyId }, type: QueryTypes.SELECT, transaction }
	);
	const collections = await assessCollections(
		show,
		people.map((p) => p.id),
		{ transaction }
	);
	const messages: QueuedMail[] = [];
	for (const person of people) {
		const plants = plantsToRemind(collections.get(person.id) ?? []);
		if (plants.length === 0) continue;
		messages.push({
			kind: REMINDER_KIND,
			to: person.email,
			societyId: show.societyId,
			showId: show.id,
			recipientId: person.id,
			dedupeKey: `${REMINDER_KIND}:${show.id}:${person.id}`,
			...buildReminder(show, person, plants)
		});
	}
	return messages.length > 0 ? queueMail(messages, { transaction }) : 0;
}

/**
 * The hourly check (the `reminders-check` job on its schedule): queues reminders for every published show whose entries are open and close
 * within REMINDER_DAYS_BEFORE_CLOSE days, "today" being read in each society's time zone by
 * `todayOf` (e.g. `(zone) => todayIn(zone)`). Safe to run often (dedupe keys).
 */
export async function queueDueReminders(todayOf: (timeZone: string) => IsoDate): Promise<number> {
	const shows = await sequelize.query<{
		id: string;
		time_zone: string;
		entries_open: string;
		entries_close: string;
	}>(
		`SELECT s.id, so.time_zone, s.entries_open::text, s.entries_close::text
		   FROM shows s JOIN societies so ON so.id = s.society_id
		  WHERE s.schedule_published_at IS NOT NULL`,
		{ type: QueryTypes.SELECT }
	);
	let queued = 0;
	for (const show of shows) {
		const today = todayOf(show.time_zone);
		const due =
			compareIsoDates(show.entries_open, today) <= 0 &&
			isOnOrBetween(show.entries_close, today, addCalendarDays(today, REMINDER_DAYS_BEFORE_CLOSE));
		if (!due) continue;
		queued += await sequelize.transaction((transaction) =>
			queueEntryReminders(show.id, { transaction, today })
		);
	}
	return queued;
}

/** The chair's "send the reminders now": this show's reminders as of the society's today. */
export async function sendEntryRemindersNow(showId: string, societyId: string): Promise<number> {
	return sequelize.transaction(async (transaction) =>
		queueEntryReminders(showId, {
			transaction,
			today: await societyToday(societyId, { transaction })
		})
	);
}
