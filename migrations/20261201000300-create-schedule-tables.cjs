'use strict';

/** Variety registry, scales of points, shows with their divisions and classes. */
module.exports = {
	async up(queryInterface, Sequelize) {
		const id = () => ({
			type: Sequelize.UUID,
			primaryKey: true,
			defaultValue: Sequelize.literal('gen_random_uuid()')
		});
		const ref = (model, allowNull = false, onDelete = 'CASCADE') => ({
			type: Sequelize.UUID,
			allowNull,
			references: { model, key: 'id' },
			onDelete
		});
		const stamp = () => ({
			type: Sequelize.DATE,
			allowNull: false,
			defaultValue: Sequelize.literal('now()')
		});
		const texts = () => ({
			type: Sequelize.ARRAY(Sequelize.STRING(40)),
			allowNull: false,
			defaultValue: []
		});

		await queryInterface.createTable('varieties', {
			id: id(),
			society_id: ref('societies'),
			name: { type: Sequelize.STRING(120), allowNull: false },
			hybridizer: { type: Sequelize.STRING(120) },
			habit: { type: Sequelize.STRING(16), allowNull: false },
			size_class: { type: Sequelize.STRING(16), allowNull: false },
			blossom_type: { type: Sequelize.STRING(24), allowNull: false },
			blossom_colours: texts(),
			foliage: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'plain' },
			is_species: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: false },
			description: { type: Sequelize.TEXT },
			created_at: stamp(),
			updated_at: stamp()
		});
		await queryInterface.sequelize.query(
			'CREATE UNIQUE INDEX varieties_society_name_unique ON varieties (society_id, lower(name))'
		);
		await queryInterface.sequelize.query(`ALTER TABLE varieties
			ADD CONSTRAINT varieties_habit_known CHECK (habit IN ('single_crown','trailer')),
			ADD CONSTRAINT varieties_size_known CHECK (size_class IN ('miniature','semiminiature','standard','large')),
			ADD CONSTRAINT varieties_foliage_known CHECK (foliage IN ('plain','variegated'))`);

		await queryInterface.createTable('scales', {
			id: id(),
			society_id: ref('societies', true),
			name: { type: Sequelize.STRING(120), allowNull: false },
			criteria: { type: Sequelize.JSONB, allowNull: false },
			created_at: stamp()
		});

		await queryInterface.createTable('shows', {
			id: id(),
			society_id: ref('societies'),
			name: { type: Sequelize.STRING(160), allowNull: false },
			slug: { type: Sequelize.STRING(80), allowNull: false, unique: true },
			venue: { type: Sequelize.STRING(240) },
			entries_open: { type: Sequelize.DATEONLY, allowNull: false },
			entries_close: { type: Sequelize.DATEONLY, allowNull: false },
			entry_day: { type: Sequelize.DATEONLY, allowNull: false },
			judging_day: { type: Sequelize.DATEONLY, allowNull: false },
			public_hours: { type: Sequelize.STRING(240) },
			possession_months: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 3 },
			max_entries_per_class: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 2 },
			max_entries_per_variety: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 1 },
			require_good_standing: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: true },
			award_rules: { type: Sequelize.JSONB, allowNull: false, defaultValue: {} },
			panel_score_method: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'mean' },
			next_entry_number: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 1 },
			schedule_published_at: { type: Sequelize.DATE },
			results_published_at: { type: Sequelize.DATE },
			created_at: stamp(),
			updated_at: stamp()
		});
		await queryInterface.sequelize.query(`ALTER TABLE shows
			ADD CONSTRAINT shows_dates_in_order CHECK (entries_open <= entries_close AND entries_close <= entry_day AND entry_day <= judging_day),
			ADD CONSTRAINT shows_panel_score_known CHECK (panel_score_method IN ('mean','consensus'))`);
		await queryInterface.addIndex('shows', ['society_id']);

		await queryInterface.createTable('divisions', {
			id: id(),
			show_id: ref('shows'),
			code: { type: Sequelize.STRING(8), allowNull: false },
			name: { type: Sequelize.STRING(160), allowNull: false },
			kind: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'horticulture' },
			position: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 }
		});
		await queryInterface.addConstraint('divisions', {
			fields: ['show_id', 'code'],
			type: 'unique',
			name: 'divisions_show_code_unique'
		});

		await queryInterface.createTable('classes', {
			id: id(),
			show_id: ref('shows'),
			division_id: ref('divisions'),
			code: { type: Sequelize.STRING(8), allowNull: false },
			name: { type: Sequelize.STRING(160), allowNull: false },
			description: { type: Sequelize.TEXT },
			position: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
			habit: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'any' },
			size_classes: texts(),
			blossom_types: texts(),
			blossom_colours: texts(),
			foliage: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'any' },
			min_crowns: { type: Sequelize.INTEGER },
			max_crowns: { type: Sequelize.INTEGER },
			collection_size: { type: Sequelize.INTEGER },
			species_only: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: false },
			max_diameter_in: { type: Sequelize.DECIMAL(5, 2) },
			scale_id: ref('scales', true, 'SET NULL')
		});
		await queryInterface.addConstraint('classes', {
			fields: ['show_id', 'code'],
			type: 'unique',
			name: 'classes_show_code_unique'
		});
		await queryInterface.addIndex('classes', ['division_id']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('classes');
		await queryInterface.dropTable('divisions');
		await queryInterface.dropTable('shows');
		await queryInterface.dropTable('scales');
		await queryInterface.dropTable('varieties');
	}
};
