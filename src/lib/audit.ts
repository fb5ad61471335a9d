/**
 * The actions kept in the audit log, with the plain words the log page shows. Every destructive
 * or irreversible action of the app has one; `score.change` rows come from the score sheets'
 * own change record (score_audit), read into the same log.
 */
export const AUDIT_ACTIONS = {
	'roles.change': 'Roles changed',
	'dues_period.remove': 'Dues period removed',
	'schedule.unpublish': 'Schedule hidden from the public',
	'division.delete': 'Division removed',
	'class.delete': 'Class removed',
	'panel.delete': 'Panel removed',
	'panel.judge_remove': 'Judge taken off a panel',
	'panel.clerk_change': 'Panel clerk replaced or removed',
	'panel.class_change': 'Class taken off its panel',
	'entry.withdraw': 'Entry withdrawn',
	'entry.move': 'Entry moved to another class',
	'entry.scratch': 'Entry scratched',
	'entry_numbers.fix': 'Entry numbers fixed in shuffled order',
	'entry_photo.delete': 'Entry photo removed',
	'results.publish': 'Results published',
	'plant.gone': 'Plant marked as no longer grown',
	'plant_event.delete': 'Plant log line removed',
	'plant_photo.delete': 'Plant photo removed',
	'score.change': 'Score sheet changed'
} as const;

export type AuditAction = keyof typeof AUDIT_ACTIONS;

/** True when the value names an action of the audit log. */
export function isAuditAction(value: unknown): value is AuditAction {
	return typeof value === 'string' && Object.hasOwn(AUDIT_ACTIONS, value);
}

/** One row of the audit log as the log page shows it. */
export interface AuditRow {
	id: string;
	at: string;
	action: AuditAction;
	actorId: string;
	actor: string;
	showName: string | null;
	targetKind: string;
	targetLabel: string;
	details: Record<string, unknown>;
}

/** A page of the audit log with the filters it was read with. */
export interface AuditPage {
	rows: AuditRow[];
	total: number;
	page: number;
	pageSize: number;
	people: { id: string; label: string }[];
}

const list = (value: unknown) =>
	Array.isArray(value) && value.length ? value.map(String).join(', ') : 'none';
const text = (value: unknown) => (value === null || value === undefined ? 'none' : String(value));
const count = (value: unknown, word: string) =>
	`${text(value)} ${Number(value) === 1 ? word : word.endsWith('s') ? `${word}es` : `${word}s`}`;
const side = (details: Record<string, unknown>, which: 'before' | 'after') =>
	(details[which] ?? {}) as Record<string, unknown>;

/** A short sentence saying what an audit row changed, from its details. */
export function describeAuditDetails(
	action: AuditAction,
	details: Record<string, unknown>
): string {
	const before = side(details, 'before');
	const after = side(details, 'after');
	switch (action) {
		case 'roles.change':
			return `Roles were: ${list(before.roles)}; now: ${list(after.roles)}.`;
		case 'entry.move':
			return `From class ${text(before.class)} to class ${text(after.class)}.`;
		case 'entry.scratch':
			return `Reason: ${text(details.reason)}.`;
		case 'entry_numbers.fix':
			return `Entries numbered afresh: ${text(after.entries)}.`;
		case 'entry.withdraw': {
			const fee: Record<string, string> = {
				none: 'no fee involved',
				cancelled: 'unpaid fee no longer owed',
				refund_requested: 'fee refund requested',
				kept: 'fee kept under the show’s rule'
			};
			return `Fee: ${fee[String(details.fee)] ?? text(details.fee)}.`;
		}
		case 'panel.clerk_change':
			return `Clerk was ${text(before.clerk)}; now ${text(after.clerk)}.`;
		case 'panel.class_change':
			return `Panel was ${text(before.panel)}; now ${text(after.panel)}.`;
		case 'panel.delete':
			return `It had ${count(before.judges, 'judge')} and ${count(before.classes, 'class')}.`;
		case 'division.delete':
			return `${count(before.classes, 'class')} went with it.`;
		case 'results.publish':
			return `${text(details.awards)} awards, ${text(details.ties)} ties; ${text(details.withoutScore)} entries without a score.`;
		case 'score.change':
			return details.before === null || details.before === undefined
				? `New sheet, total ${text(details.after)}.`
				: `Total ${text(details.before)} → ${text(details.after)}${details.notJudged ? ' (not judged)' : ''}.`;
		case 'dues_period.remove':
			return `${text(before.startsOn)} to ${text(before.endsOn)}.`;
		case 'plant.gone':
			return `No longer grown from ${text(after.goneOn)}.`;
		default:
			return '';
	}
}
