import { z } from 'zod';
import { COUNTRIES, isKnownCountry } from '../domain/countries';
import { CURRENCIES } from '../domain/money';
import { PAPER_SIZES, isTimeZone } from '../domain/society-settings';
import type { LengthUnit } from '../domain/units';
import { CONTROL_CHARS_MESSAGE, hasNoControlChars } from './text';

/** The short name in a society's addresses: lower-case letters, digits and single hyphens. */
export const SLUG_PATTERN = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

/** A society's name, short name and settings, as the start and settings forms send them. */
export const societyFieldsSchema = z.object({
	name: z
		.string('Enter the society’s name.')
		.trim()
		.min(3, 'Enter the society’s name (at least 3 characters).')
		.max(160, 'Keep the name under 160 characters.')
		.refine(hasNoControlChars, CONTROL_CHARS_MESSAGE),
	slug: z
		.string('Enter a short name for addresses.')
		.trim()
		.min(3, 'Make the short name at least 3 characters.')
		.max(60, 'Keep the short name to 60 characters or fewer.')
		.regex(
			SLUG_PATTERN,
			'Use lower-case letters, digits and single hyphens only (like “lakeside-violets”).'
		),
	country: z
		.string('Choose a country.')
		.refine((v) => isKnownCountry(v), 'Choose a country from the list.'),
	unit: z.enum(
		['in', 'cm'] as const satisfies readonly LengthUnit[],
		'Choose inches (in) or centimeters (cm).'
	),
	paperSize: z.enum(PAPER_SIZES, 'Choose Letter or A4.'),
	timeZone: z
		.string('Choose a time zone.')
		.refine((v) => isTimeZone(v), 'Choose a time zone from the list (like America/Chicago).'),
	currency: z.enum(CURRENCIES, 'Choose a currency from the list.')
});

export type SocietyFields = z.infer<typeof societyFieldsSchema>;

/** Form: start a society. */
export const startSocietySchema = societyFieldsSchema;

/** Form: the society admin changes the society's name, short name and settings. */
export const editSocietySchema = societyFieldsSchema.extend({
	societyId: z.uuid('Choose a society.')
});

/** The fields of a society form, read from the posted form data. */
export function societyFormValues(form: FormData): Record<string, unknown> {
	const keys = [
		'societyId',
		'name',
		'slug',
		'country',
		'unit',
		'paperSize',
		'timeZone',
		'currency'
	];
	return Object.fromEntries(keys.map((k) => [k, form.get(k) ?? undefined]));
}

/** The choices the society forms offer (time zones as the runtime knows them). */
export function societyFormOptions(): {
	countries: { value: string; label: string }[];
	units: { value: string; label: string }[];
	paperSizes: { value: string; label: string }[];
	timeZones: { value: string; label: string }[];
	currencies: { value: string; label: string }[];
} {
	const zones = Intl.supportedValuesOf('timeZone');
	if (!zones.includes('UTC')) zones.push('UTC');
	return {
		countries: COUNTRIES.map((c) => ({ value: c.code, label: `${c.name} (${c.code})` })),
		units: [
			{ value: 'in', label: 'Inches first (in)' },
			{ value: 'cm', label: 'Centimeters first (cm)' }
		],
		paperSizes: [
			{ value: 'letter', label: 'Letter (8.5 × 11 in)' },
			{ value: 'a4', label: 'A4 (210 × 297 mm)' }
		],
		timeZones: zones.map((z) => ({ value: z, label: z.replaceAll('_', ' ') })),
		currencies: CURRENCIES.map((c) => ({ value: c, label: c }))
	};
}
