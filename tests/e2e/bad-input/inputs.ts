import fc from 'fast-check';

/**
 * Generated bad input. Every field a sample carries holds a value that breaks the field's contract
 * (wrong type, out of range, empty, far too long, control characters, unknown ids, wrong enum
 * values), so no sample is a valid request: each must be refused with a 4xx and change nothing.
 */

/** A long string (min..min+200 characters) made by repeating a short random one: cheap to make. */
const huge = (min: number) =>
	fc
		.tuple(fc.string({ minLength: 1, maxLength: 12, unit: 'binary' }), fc.nat({ max: 200 }))
		.map(([s, extra]) => s.repeat(Math.ceil((min + extra) / s.length)).slice(0, min + extra));
const withNul = fc.string({ maxLength: 20 }).map((s) => `${s}\u0000${s}`);
const controlChars = fc.constantFrom('\u0001', '\u0008', '\u001b[31m', '\u007f', '\r\n\r\n');

/** Bad for any field: empty, blank, far over any length limit, or holding a NUL byte. */
const anyBad = fc.oneof(
	fc.constant(''),
	fc.constantFrom(' ', '\t', '\n \n'),
	huge(5_000),
	huge(20_000),
	withNul,
	controlChars.map((c) => `${c}${c}`)
);

const badId = fc.oneof(
	anyBad,
	fc.uuid(), // well formed, but names nothing
	fc.constantFrom(
		'not-an-id',
		'1 OR 1=1',
		"'; DROP TABLE users; --",
		'../../etc/passwd',
		'-1',
		'0'
	),
	fc.integer().map(String),
	fc.string({ minLength: 1, maxLength: 40 }).filter((s) => !/^[0-9a-f-]{36}$/i.test(s))
);

const badNumber = fc.oneof(
	fc.constant(''),
	fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e309', '-1', '-0.5', '0x1F', '1.2.3', 'abc'),
	fc.constantFrom('9'.repeat(400), '99999999999999999999', '1e6', '1000000'),
	fc.integer({ min: -1_000_000_000, max: -1 }).map(String),
	fc.double({ min: -1e12, max: -1e-6, noNaN: true }).map(String),
	withNul
);

const badDate = fc.oneof(
	fc.constant(''),
	fc.constantFrom('2026-13-45', '2026-02-30', 'yesterday', '0000-00-00', '99999-01-01', '1/2/2026'),
	fc.constantFrom('2026-01-01T25:61:00Z', '1800-01-01', '3000-01-01'),
	withNul,
	huge(5_000)
);

const badEmail = fc.oneof(
	fc.constant(''),
	fc.constantFrom('not-an-address', '@', 'a@', '@b.test', 'a@b@c.test', 'a b@c.test', 'a@b'),
	huge(5_000).map((s) => `${s}@x.test`),
	withNul.map((s) => `${s}@x.test`),
	fc.constantFrom('<script>@x.test', 'a@-.test')
);

const badChoice = fc.oneof(
	anyBad,
	fc.constantFrom(
		'bogus',
		'ADMIN',
		'superuser',
		'true;drop',
		'[]',
		'{}',
		'null',
		'undefined',
		'1e309'
	)
);

const NUMBER_FIELD =
	/^(number|crowns|diameter|potSize|size|page|value|first|second|third|blue|red|white|honourable|merit|single|trailer|placement|minScore|bestInClassMin|maxCrowns|minCrowns|maxDiameterIn|maxEntriesPerClass|maxEntriesPerVariety|possessionMonths|judgesChoiceRank|collectionSize|baseVersion|sort|numbers)$/;
const DATE_FIELD = /(On|Day|entriesOpen|entriesClose)$/;
const ID_FIELD = /(^id|Id|Ids)$/;
const CHOICE_FIELD =
	/^(kind|status|roles|habit|blossomType|blossomTypes|sizeClass|sizeClasses|unit|awardSystem|system|published|reminders|results|isSpecies|speciesOnly|requireGoodStanding|goodRowsOnly|allowIncomplete|useJudgesChoice|notJudged|topAwards|tieBreak|sweepstakesTieBreak|obtainedHow|dir|scaleId|criterionKey|foliage|blossomColours|redirectTo|next|form|show)$/;

/** A bad value for a field, chosen by what the field's name says it holds. */
export function badValue(field: string): fc.Arbitrary<string> {
	if (field === 'email') return badEmail;
	if (ID_FIELD.test(field)) return badId;
	if (NUMBER_FIELD.test(field)) return badNumber;
	if (DATE_FIELD.test(field)) return badDate;
	if (CHOICE_FIELD.test(field)) return badChoice;
	return anyBad;
}

/** Field names of the app's zod schemas: samples also carry some of these, with bad values. */
export const KNOWN_FIELDS = (
	'acquiredOn awardSystem baseVersion bestInClassMin blossomColours blossomType blossomTypes blue ' +
	'changeId classId classIds code collectionSize comment criterionKey crowns deductions description ' +
	'diameter dir divisionId email entriesClose entriesOpen entryDay entryId first foliage habit ' +
	'happenedOn honourable hybridizer id isSpecies judgesChoiceRank judgingDay kind label maxCrowns ' +
	'maxDiameterIn maxEntriesPerClass maxEntriesPerVariety merit message minCrowns minScore name ' +
	'notJudged note notes obtainedHow obtainedOn page panelId parentId path placement ' +
	'possessionMonths potSize publicHours q reason red redirectTo reminders requireGoodStanding ' +
	'results roles scaleId second showSlug single size sizeClass sizeClasses societyId sort ' +
	'speciesOnly status sweepstakesTieBreak system third tieBreak topAwards trailer unit ' +
	'useJudgesChoice userId value varietyId venue white photo file caption goneOn'
).split(' ');

/** A file that is not what it claims: wrong content, path parts in its name, empty or oversize. */
export interface BadFile {
	name: string;
	type: string;
	bytes: Uint8Array;
}
const badFile: fc.Arbitrary<BadFile> = fc.record({
	name: fc.constantFrom(
		'../../etc/passwd.jpg',
		'..\\..\\boot.ini.png',
		'/tmp/x.jpg',
		'photo.jpg\u0000.sh',
		'a'.repeat(600) + '.jpg',
		'photo.jpg'
	),
	type: fc.constantFrom('image/jpeg', 'image/png', 'text/csv', 'application/x-sh', ''),
	bytes: fc.oneof(
		{ depthSize: 'small', withCrossShrink: false },
		{ weight: 10, arbitrary: fc.constant(new Uint8Array()) },
		{ weight: 10, arbitrary: fc.uint8Array({ minLength: 1, maxLength: 2_000 }) }, // no image
		{ weight: 10, arbitrary: fc.constant(new TextEncoder().encode('#!/bin/sh\nrm -rf /\n')) },
		{ weight: 10, arbitrary: fc.constant(new TextEncoder().encode('<svg onload="x()"></svg>')) },
		// Over the photo limit (8 MB), and no photo: rare, it is slow to send.
		{ weight: 1, arbitrary: fc.constant(new Uint8Array(9 * 1024 * 1024).fill(0xff)) }
	)
});

export type FormSample = { fields: [string, string][]; files: [string, BadFile][] };

/**
 * A bad form: each of the target's fields is missing, or present (once or repeated) with bad values;
 * a few other known fields and unknown ones come along, and file fields get bad files.
 */
export function badForm(fields: readonly string[]): fc.Arbitrary<FormSample> {
	const own = fields.map((f) =>
		fc.oneof(
			{ weight: 1, arbitrary: fc.constant([] as [string, string][]) },
			{ weight: 5, arbitrary: badValue(f).map((v) => [[f, v]] as [string, string][]) },
			{
				weight: 1,
				arbitrary: fc
					.array(badValue(f), { minLength: 2, maxLength: 3 })
					.map((vs) => vs.map((v) => [f, v] as [string, string]))
			}
		)
	);
	const extra: fc.Arbitrary<[string, string][]> = fc
		.subarray(KNOWN_FIELDS, { maxLength: 6 })
		.chain((names) =>
			fc.tuple(...names.map((n) => badValue(n).map((v) => [n, v] as [string, string])))
		)
		.map((pairs) => [...pairs]);
	const unknown = fc.array(fc.tuple(fc.string({ minLength: 1, maxLength: 30 }), anyBad), {
		maxLength: 3
	});
	const fileFields = fields.filter((f) => f === 'photo' || f === 'file');
	const files: fc.Arbitrary<[string, BadFile][]> = fileFields.length
		? fc.array(fc.tuple(fc.constantFrom(...fileFields), badFile), { maxLength: 3 })
		: fc.constant([]);
	const owned: fc.Arbitrary<[string, string][][]> = fc.tuple(...own).map((o) => [...o]);
	return fc
		.tuple(owned, extra, unknown, files)
		.map(([o, e, u, f]) => ({ fields: [...o.flat(), ...e, ...u], files: f }));
}

/** Bad JSON bodies: broken syntax, wrong shapes, and objects whose every field is bad. */
export function badJson(fields: readonly string[]): fc.Arbitrary<string> {
	const badScalar = fc.oneof(
		fc.constant(null),
		fc.boolean(),
		fc.constantFrom(-1, 1e308, -1e308, 0.5, Number.MAX_SAFE_INTEGER + 2),
		anyBad,
		fc.array(anyBad, { maxLength: 3 }),
		fc.dictionary(fc.string({ maxLength: 5 }), anyBad, { maxKeys: 2 })
	);
	const objectOf = (names: readonly string[]) =>
		fc
			.tuple(...names.map((n) => fc.option(fc.oneof(badValue(n), badScalar), { nil: undefined })))
			.map((vs) =>
				Object.fromEntries(names.map((n, i) => [n, vs[i]]).filter(([, v]) => v !== undefined))
			);
	return fc.oneof(
		fc.constantFrom(
			'',
			'{',
			'{"a":',
			'null',
			'[]',
			'"text"',
			'42',
			'true',
			'{"__proto__":{"x":1}}'
		),
		fc.string({ maxLength: 200 }),
		huge(20_000).map((s) => JSON.stringify({ x: s })),
		fc.array(objectOf(fields), { maxLength: 3 }).map((a) => JSON.stringify(a)),
		objectOf(fields).map((o) => JSON.stringify(o)),
		objectOf(KNOWN_FIELDS.slice(0, 40)).map((o) => JSON.stringify(o))
	);
}

/** Bad query strings for GET endpoints. */
export function badQuery(fields: readonly string[]): fc.Arbitrary<string> {
	return badForm(fields).map((s) =>
		new URLSearchParams(s.fields.map(([k, v]) => [k, v.slice(0, 3000)])).toString()
	);
}

/** Bad values for a path parameter. */
export const badParam = fc
	.oneof(
		fc.uuid(),
		fc.constantFrom('not-an-id', '%2e%2e', '.x', '-1', '0', '99999999999', 'NaN', ' ', "'"),
		fc.string({ minLength: 1, maxLength: 300 }),
		huge(1_000)
	)
	// A URL cannot carry lone surrogates: replace them as a browser would.
	.map((s) => (s as string & { toWellFormed(): string }).toWellFormed());
