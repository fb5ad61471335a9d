import { lengthField, plantSchema, type PlantInput } from '$lib/schemas/plants';
import { fieldErrors } from './plant-route';

const FIELDS = [
	'varietyId',
	'label',
	'obtainedHow',
	'obtainedOn',
	'parentId',
	'potSize',
	'potSizeUnit',
	'notes'
];

/** The plant form's fields as sent, to show again after an error. */
export function plantFormValues(form: FormData): Record<string, string> {
	return Object.fromEntries(FIELDS.map((key) => [key, String(form.get(key) ?? '')]));
}

/** Reads and validates the plant form: the data, or a message per field and the values sent. */
export function readPlantForm(
	form: FormData
):
	| { ok: true; data: PlantInput }
	| { ok: false; errors: Record<string, string>; values: Record<string, string> } {
	const parsed = plantSchema.safeParse({
		varietyId: form.get('varietyId') ?? '',
		label: form.get('label') ?? '',
		obtainedHow: form.get('obtainedHow') ?? '',
		obtainedOn: form.get('obtainedOn') ?? '',
		parentId: form.get('parentId') ?? '',
		potSize: lengthField(form, 'potSize'),
		notes: form.get('notes') ?? ''
	});
	if (parsed.success) return { ok: true, data: parsed.data };
	return { ok: false, errors: fieldErrors(parsed.error), values: plantFormValues(form) };
}
