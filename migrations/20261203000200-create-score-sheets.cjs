'use strict';

/**
 * Score sheets (one per entry and judge, or one consensus sheet per entry), the change ids already
 * applied (so a replayed offline queue applies each change once) and the audit log of every score
 * change. A trigger refuses sheet writes once the show's results are published.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		const stamp = () => ({
			type: Sequelize.DATE,
			allowNull: false,
			defaultValue: Sequelize.literal('now()')
		});
		await queryInterface.createTable('score_sheets', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			show_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'shows', key: 'id' },
				onDelete: 'CASCADE'
			},
			entry_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'entries', key: 'id' },
				onDelete: 'CASCADE'
			},
			kind: { type: Sequelize.STRING(16), allowNull: false },
			// The judge of a judge's sheet; null on a consensus sheet.
			judge_id: {
				type: Sequelize.UUID,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			},
			deductions: { type: Sequelize.JSONB, allowNull: false, defaultValue: {} },
			comment: { type: Sequelize.TEXT, allowNull: false, defaultValue: '' },
			not_judged_reason: { type: Sequelize.STRING(24) },
			not_judged_note: { type: Sequelize.STRING(200) },
			judges_choice_rank: { type: Sequelize.INTEGER },
			version: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 1 },
			updated_by: { type: Sequelize.UUID },
			created_at: stamp(),
			updated_at: stamp()
		});
		await queryInterface.sequelize.query(`ALTER TABLE score_sheets
			ADD CONSTRAINT score_sheets_kind_known CHECK (kind IN ('judge','consensus')),
			ADD CONSTRAINT score_sheets_judge_matches_kind CHECK ((kind = 'judge') = (judge_id IS NOT NULL)),
			ADD CONSTRAINT score_sheets_reason_known CHECK (not_judged_reason IS NULL OR not_judged_reason IN ('wrong_class','suckers','pests','not_in_bloom','other')),
			ADD CONSTRAINT score_sheets_version_positive CHECK (version >= 1)`);
		await queryInterface.sequelize.query(
			`CREATE UNIQUE INDEX score_sheets_judge_unique ON score_sheets (entry_id, judge_id) WHERE kind = 'judge'`
		);
		await queryInterface.sequelize.query(
			`CREATE UNIQUE INDEX score_sheets_consensus_unique ON score_sheets (entry_id) WHERE kind = 'consensus'`
		);
		await queryInterface.addIndex('score_sheets', ['show_id']);

		await queryInterface.createTable('applied_changes', {
			change_id: { type: Sequelize.UUID, primaryKey: true },
			user_id: { type: Sequelize.UUID, allowNull: false },
			sheet_id: {
				type: Sequelize.UUID,
				references: { model: 'score_sheets', key: 'id' },
				onDelete: 'CASCADE'
			},
			// The answer given when the change was applied, given again to a replay.
			response: { type: Sequelize.JSONB, allowNull: false },
			applied_at: stamp()
		});

		await queryInterface.createTable('score_audit', {
			id: { type: Sequelize.BIGINT, primaryKey: true, autoIncrement: true },
			show_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'shows', key: 'id' },
				onDelete: 'CASCADE'
			},
			sheet_id: { type: Sequelize.UUID, allowNull: false },
			entry_id: { type: Sequelize.UUID, allowNull: false },
			// Who, kept as written at the time (no foreign key: the record outlives accounts).
			actor_id: { type: Sequelize.UUID, allowNull: false },
			actor_email: { type: Sequelize.STRING, allowNull: false },
			change_id: { type: Sequelize.UUID },
			before: { type: Sequelize.JSONB },
			after: { type: Sequelize.JSONB, allowNull: false },
			at: stamp()
		});
		await queryInterface.addIndex('score_audit', ['show_id', 'at']);
		await queryInterface.addIndex('score_audit', ['sheet_id']);

		await queryInterface.sequelize.query(`
			CREATE FUNCTION crownbench_refuse_after_results() RETURNS trigger AS $$
			BEGIN
				IF EXISTS (SELECT 1 FROM shows WHERE id = NEW.show_id AND results_published_at IS NOT NULL) THEN
					RAISE EXCEPTION 'results of show % are published; scores and awards are locked', NEW.show_id
						USING ERRCODE = 'P0001';
				END IF;
				RETURN NEW;
			END;
			$$ LANGUAGE plpgsql`);
		await queryInterface.sequelize.query(`CREATE TRIGGER score_sheets_locked_after_results
			BEFORE INSERT OR UPDATE ON score_sheets
			FOR EACH ROW EXECUTE FUNCTION crownbench_refuse_after_results()`);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('score_audit');
		await queryInterface.dropTable('applied_changes');
		await queryInterface.dropTable('score_sheets');
		await queryInterface.sequelize.query(
			'DROP FUNCTION IF EXISTS crownbench_refuse_after_results()'
		);
	}
};
