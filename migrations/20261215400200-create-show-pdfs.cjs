'use strict';

/**
 * Whole-show PDFs (award sheets, award cards, ribbon labels), built by the `show-pdf` job off the
 * request path and kept: one row per show, document, publication (results_published_at) and
 * paper, so a publication's documents are served again unchanged.
 */
module.exports = {
	async up(queryInterface) {
		await queryInterface.sequelize.query(`
			CREATE TABLE show_pdfs (
				id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
				show_id uuid NOT NULL REFERENCES shows(id) ON DELETE CASCADE,
				document text NOT NULL CHECK (document IN ('award-sheets.pdf', 'award-cards.pdf', 'ribbon-labels.pdf')),
				published_at timestamptz NOT NULL,
				paper_size text NOT NULL,
				status text NOT NULL DEFAULT 'waiting' CHECK (status IN ('waiting', 'building', 'ready', 'failed')),
				content bytea,
				bytes integer,
				last_error text,
				requested_at timestamptz NOT NULL DEFAULT now(),
				built_at timestamptz,
				UNIQUE (show_id, document, published_at, paper_size)
			)`);
	},

	async down(queryInterface) {
		await queryInterface.sequelize.query('DROP TABLE IF EXISTS show_pdfs');
	}
};
