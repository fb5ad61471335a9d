/**
 * Whole-show PDFs off the request path: publishing (or the chair asking) queues a `show-pdf` job
 * per document in its transaction; the worker builds it from the published results and keeps it
 * (show_pdfs), so the same publication on the same paper is served again unchanged, and the
 * chair's page shows each document waiting, being built, ready or failed.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { PaperSize } from '../../../domain/society-settings';
import { sequelize } from '../../db';
import { renderAwardCards } from './award-cards';
import { renderAwardSheets } from './award-sheets';
import { renderRibbonLabels } from './ribbon-labels';
import { loadShowResults } from '../show-results';
import { loadSocietySettings } from '../../people/society-settings';
import { enqueue } from '../../jobs/enqueue';

export const SHOW_PDF_RENDERERS = {
	'award-sheets.pdf': renderAwardSheets,
	'award-cards.pdf': renderAwardCards,
	'ribbon-labels.pdf': renderRibbonLabels
} as const;

export type ShowDocument = keyof typeof SHOW_PDF_RENDERERS;
export const SHOW_DOCUMENTS = Object.keys(SHOW_PDF_RENDERERS) as ShowDocument[];

export function isShowDocument(value: string): value is ShowDocument {
	return value in SHOW_PDF_RENDERERS;
}

/** One document of a publication, as the chair's page shows it. */
export interface ShowPdfState {
	document: ShowDocument;
	/** missing: never asked for (published before documents were kept, or the paper changed). */
	status: 'missing' | 'waiting' | 'building' | 'ready' | 'failed';
	bytes: number | null;
	lastError: string | null;
	builtAt: string | null;
}

interface Publication {
	showId: string;
	societyId: string;
	publishedAt: Date;
	paperSize: PaperSize;
}

async function publicationOf(
	showId: string,
	transaction?: Transaction
): Promise<Publication | null> {
	const [show] = await sequelize.query<{ society_id: string; results_published_at: Date | null }>(
		'SELECT society_id, results_published_at FROM shows WHERE id = :showId',
		{ replacements: { showId }, type: QueryTypes.SELECT, transaction }
	);
	if (!show?.results_published_at) return null;
	const settings = await loadSocietySettings(show.society_id, { transaction });
	return {
		showId,
		societyId: show.society_id,
		publishedAt: show.results_published_at,
		paperSize: settings.paperSize
	};
}

/**
 * Makes sure each of the show's documents of its current publication and paper is kept or on its
 * way, in the caller's transaction: a missing one gets a row and a job; a failed one (when
 * `again`) is put back in line with a new job. Returns how many jobs were queued.
 */
export async function requestShowPdfs(
	showId: string,
	options: { transaction: Transaction; again?: boolean; documents?: ShowDocument[] }
): Promise<number> {
	const { transaction } = options;
	const publication = await publicationOf(showId, transaction);
	if (!publication) return 0;
	let queued = 0;
	for (const document of options.documents ?? SHOW_DOCUMENTS) {
		const rows = await sequelize.query<{ id: string }>(
			`INSERT INTO show_pdfs (show_id, document, published_at, paper_size)
			 VALUES (:showId, :document, :publishedAt, :paperSize)
			 ON CONFLICT (show_id, document, published_at, paper_size)
			 DO UPDATE SET status = 'waiting', last_error = NULL, requested_at = now()
			    WHERE show_pdfs.status = 'failed' AND CAST(:again AS boolean)
			 RETURNING id`,
			{
				replacements: {
					showId,
					document,
					publishedAt: publication.publishedAt,
					paperSize: publication.paperSize,
					again: options.again ?? false
				},
				type: QueryTypes.SELECT,
				transaction
			}
		);
		if (rows.length === 0) continue;
		await enqueue(
			'show-pdf',
			{ pdfId: rows[0].id, societyId: publication.societyId },
			{ transaction }
		);
		queued++;
	}
	return queued;
}

/** The state of each document of the show's current publication and paper. */
export async function showPdfStates(showId: string): Promise<ShowPdfState[]> {
	const publication = await publicationOf(showId);
	if (!publication) return [];
	const rows = await sequelize.query<{
		document: ShowDocument;
		status: Exclude<ShowPdfState['status'], 'missing'>;
		bytes: number | null;
		last_error: string | null;
		built_at: Date | null;
	}>(
		`SELECT document, status, bytes, last_error, built_at FROM show_pdfs
		  WHERE show_id = :showId AND published_at = :publishedAt AND paper_size = :paperSize`,
		{
			replacements: {
				showId,
				publishedAt: publication.publishedAt,
				paperSize: publication.paperSize
			},
			type: QueryTypes.SELECT
		}
	);
	return SHOW_DOCUMENTS.map((document) => {
		const row = rows.find((r) => r.document === document);
		return {
			document,
			status: row?.status ?? 'missing',
			bytes: row?.bytes ?? null,
			lastError: row?.last_error ?? null,
			builtAt: row?.built_at ? row.built_at.toISOString() : null
		};
	});
}

/** The kept PDF of the show's current publication and paper, or null while none is ready. */
export async function keptShowPdf(showId: string, document: ShowDocument): Promise<Buffer | null> {
	const publication = await publicationOf(showId);
	if (!publication) return null;
	const [row] = await sequelize.query<{ content: Buffer }>(
		`SELECT content FROM show_pdfs
		  WHERE show_id = :showId AND document = :document AND published_at = :publishedAt
		    AND paper_size = :paperSize AND status = 'ready'`,
		{
			replacements: {
				showId,
				document,
				publishedAt: publication.publishedAt,
				paperSize: publication.paperSize
			},
			type: QueryTypes.SELECT
		}
	);
	return row?.content ?? null;
}

/**
 * Builds one kept document: the `show-pdf` job's effect. A document already built is left as it
 * is (once only); one whose publication is no longer the show's (results withdrawn) is not built.
 * A failure is recorded on the row and thrown, for the queue to try again (on the last attempt
 * the row is marked failed, with the error, for the chair to ask again).
 */
export async function buildShowPdfJob(
	pdfId: string,
	options: { lastAttempt: boolean }
): Promise<string> {
	const [row] = await sequelize.query<{
		show_id: string;
		document: ShowDocument;
		published_at: Date;
		paper_size: PaperSize;
	}>(
		`UPDATE show_pdfs SET status = 'building'
		  WHERE id = :pdfId AND status IN ('waiting', 'building', 'failed')
		RETURNING show_id, document, published_at, paper_size`,
		{ replacements: { pdfId }, type: QueryTypes.SELECT }
	);
	if (!row) return 'not-due';
	try {
		const publication = await publicationOf(row.show_id);
		if (!publication || publication.publishedAt.getTime() !== row.published_at.getTime()) {
			throw new Error('The results this document was asked for are no longer the published ones.');
		}
		const results = await loadShowResults(row.show_id);
		if (!results) throw new Error('The show has no published results.');
		const pdf = await SHOW_PDF_RENDERERS[row.document](results, row.paper_size);
		await sequelize.query(
			`UPDATE show_pdfs SET status = 'ready', content = :content, bytes = :bytes, built_at = now(),
			        last_error = NULL
			  WHERE id = :pdfId`,
			{ replacements: { pdfId, content: pdf, bytes: pdf.length } }
		);
		return `built ${pdf.length} bytes`;
	} catch (error) {
		const message = error instanceof Error ? error.message : String(error);
		await sequelize.query(
			'UPDATE show_pdfs SET status = :status, last_error = :lastError WHERE id = :pdfId',
			{
				replacements: {
					pdfId,
					lastError: message.slice(0, 1000),
					status: options.lastAttempt ? 'failed' : 'waiting'
				}
			}
		);
		throw error;
	}
}
