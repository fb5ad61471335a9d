/**
 * The public schedule PDF, kept per show in each app process until what it is made from changes.
 * The key is a hash of the schedule data the route just read (the show, its divisions and classes)
 * and of the society's row (its name and settings, such as a paper size), read fresh on every
 * request: an edit anywhere is seen by every instance at once. Only the rendering is saved.
 */
import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../db';

const SIZE = 32;
const copies = new Map<string, { key: string; pdf: Promise<Buffer> }>();

/** The society's whole row, as text: any change of its settings changes the key. */
async function societyRowOf(slug: string): Promise<string> {
	const [row] = await sequelize.query<{ society: string }>(
		`SELECT row_to_json(so)::text AS society
		   FROM societies so JOIN shows s ON s.society_id = so.id WHERE s.slug = :slug`,
		{ replacements: { slug }, type: QueryTypes.SELECT }
	);
	return row?.society ?? '';
}

/**
 * The schedule PDF of a show: the kept copy when `schedule` (the data it is made from) and the
 * society are as they were, otherwise `build()` once (parallel requests share one build).
 */
export async function cachedSchedulePdf(
	slug: string,
	schedule: unknown,
	build: () => Promise<Buffer>
): Promise<Buffer> {
	const key = createHash('sha256')
		.update(JSON.stringify(schedule))
		.update('\u0001')
		.update(await societyRowOf(slug))
		.digest('base64url');
	const kept = copies.get(slug);
	if (kept?.key === key) return kept.pdf;
	const pdf = build();
	copies.delete(slug);
	copies.set(slug, { key, pdf });
	if (copies.size > SIZE) copies.delete(copies.keys().next().value!);
	// A failed build is not kept.
	pdf.catch(() => copies.get(slug)?.pdf === pdf && copies.delete(slug));
	return pdf;
}
