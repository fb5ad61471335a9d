import type { ObtainedHow, PlantEventKind, ReadinessStatus } from '$lib/domain/readiness';

/** How a plant was got, in the grower's words. */
export const OBTAINED_LABELS: Record<ObtainedHow, string> = {
	bought: 'Bought',
	traded: 'Traded',
	leaf: 'Rooted from a leaf',
	sucker: 'Rooted from a sucker',
	division: 'Divided from a trailer'
};

/** Log events, as the quick buttons and the log name them. */
export const EVENT_LABELS: Record<PlantEventKind, string> = {
	sucker_removed: 'Sucker removed',
	groomed: 'Groomed',
	repotted: 'Repotted',
	sucker_potted: 'Potted up a sucker',
	in_bloom: 'In bloom',
	disbudded: 'Disbudded',
	pest_treatment: 'Treated for pests',
	measured: 'Measured',
	note: 'Note'
};

/** The quick buttons of the log, most used first (measuring and potting have their own forms). */
export const QUICK_EVENTS: PlantEventKind[] = [
	'in_bloom',
	'groomed',
	'sucker_removed',
	'disbudded',
	'repotted',
	'pest_treatment',
	'note'
];

/** The overall readiness of a plant for a show. */
export const STATUS_LABELS: Record<ReadinessStatus, string> = {
	ready: 'Ready',
	needs_work: 'Needs work',
	cannot_enter: 'Cannot be entered',
	no_class: 'No class for it'
};
