'use strict';

/** Awards and unresolved ties stored when the chair publishes results; locked from then on. */
module.exports = {
	async up(queryInterface, Sequelize) {
		const ref = (model, allowNull = true) => ({
			type: Sequelize.UUID,
			allowNull,
			references: { model, key: 'id' },
			onDelete: 'CASCADE'
		});
		await queryInterface.createTable('awards', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			show_id: ref('shows', false),
			kind: { type: Sequelize.STRING(16), allowNull: false },
			entry_id: ref('entries'),
			exhibitor_id: ref('users'),
			class_id: ref('classes'),
			division_id: ref('divisions'),
			top_award_id: { type: Sequelize.STRING(80) },
			top_award_name: { type: Sequelize.STRING(160) },
			level: { type: Sequelize.STRING(16) },
			score: { type: Sequelize.DECIMAL(6, 2) },
			reason: { type: Sequelize.TEXT, allowNull: false },
			position: { type: Sequelize.INTEGER, allowNull: false },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		await queryInterface.sequelize.query(`ALTER TABLE awards
			ADD CONSTRAINT awards_kind_known CHECK (kind IN ('ribbon','placement','best_in_class','top_award','sweepstakes'))`);
		await queryInterface.addIndex('awards', ['show_id', 'position']);
		await queryInterface.addIndex('awards', ['entry_id']);

		await queryInterface.createTable('award_ties', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			show_id: ref('shows', false),
			kind: { type: Sequelize.STRING(16), allowNull: false },
			class_id: ref('classes'),
			division_id: ref('divisions'),
			top_award_id: { type: Sequelize.STRING(80) },
			levels: { type: Sequelize.ARRAY(Sequelize.STRING(16)), allowNull: false, defaultValue: [] },
			entry_ids: { type: Sequelize.ARRAY(Sequelize.UUID), allowNull: false, defaultValue: [] },
			exhibitor_ids: { type: Sequelize.ARRAY(Sequelize.UUID), allowNull: false, defaultValue: [] },
			reason: { type: Sequelize.TEXT, allowNull: false },
			position: { type: Sequelize.INTEGER, allowNull: false }
		});
		await queryInterface.addIndex('award_ties', ['show_id']);

		for (const table of ['awards', 'award_ties']) {
			await queryInterface.sequelize.query(`CREATE TRIGGER ${table}_locked_after_results
				BEFORE INSERT OR UPDATE ON ${table}
				FOR EACH ROW EXECUTE FUNCTION crownbench_refuse_after_results()`);
		}
	},

	async down(queryInterface) {
		await queryInterface.dropTable('award_ties');
		await queryInterface.dropTable('awards');
	}
};
