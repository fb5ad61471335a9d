'use strict';

/**
 * A member's own collection: plants (with the plant they were propagated from), the dated log of
 * what was done to each, and their photos. Plants are private to their owner; the parent of a
 * plant must be another plant of the same owner (enforced by a composite foreign key).
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		const id = () => ({
			type: Sequelize.UUID,
			primaryKey: true,
			defaultValue: Sequelize.literal('gen_random_uuid()')
		});
		const stamp = () => ({
			type: Sequelize.DATE,
			allowNull: false,
			defaultValue: Sequelize.literal('now()')
		});

		await queryInterface.createTable('plants', {
			id: id(),
			owner_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			},
			variety_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'varieties', key: 'id' }
			},
			label: { type: Sequelize.STRING(80) },
			obtained_how: { type: Sequelize.STRING(16), allowNull: false },
			obtained_on: { type: Sequelize.DATEONLY, allowNull: false },
			parent_id: { type: Sequelize.UUID },
			pot_size_in: { type: Sequelize.DECIMAL(4, 2) },
			notes: { type: Sequelize.TEXT },
			gone_on: { type: Sequelize.DATEONLY },
			created_at: stamp(),
			updated_at: stamp()
		});
		await queryInterface.sequelize.query(`ALTER TABLE plants
			ADD CONSTRAINT plants_id_owner_unique UNIQUE (id, owner_id),
			ADD CONSTRAINT plants_parent_same_owner FOREIGN KEY (parent_id, owner_id)
				REFERENCES plants (id, owner_id) ON DELETE SET NULL (parent_id),
			ADD CONSTRAINT plants_not_own_parent CHECK (parent_id IS NULL OR parent_id <> id),
			ADD CONSTRAINT plants_obtained_known CHECK (obtained_how IN ('bought','traded','leaf','sucker','division')),
			ADD CONSTRAINT plants_parent_only_when_propagated CHECK (parent_id IS NULL OR obtained_how IN ('leaf','sucker','division')),
			ADD CONSTRAINT plants_pot_size_positive CHECK (pot_size_in IS NULL OR pot_size_in > 0)`);
		await queryInterface.addIndex('plants', ['owner_id']);
		await queryInterface.addIndex('plants', ['parent_id']);

		await queryInterface.createTable('plant_events', {
			id: id(),
			plant_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'plants', key: 'id' },
				onDelete: 'CASCADE'
			},
			kind: { type: Sequelize.STRING(24), allowNull: false },
			happened_on: { type: Sequelize.DATEONLY, allowNull: false },
			diameter_in: { type: Sequelize.DECIMAL(5, 2) },
			crowns: { type: Sequelize.INTEGER },
			pot_size_in: { type: Sequelize.DECIMAL(4, 2) },
			child_plant_id: {
				type: Sequelize.UUID,
				references: { model: 'plants', key: 'id' },
				onDelete: 'SET NULL'
			},
			note: { type: Sequelize.STRING(500) },
			created_at: stamp()
		});
		await queryInterface.sequelize.query(`ALTER TABLE plant_events
			ADD CONSTRAINT plant_events_kind_known CHECK (kind IN ('sucker_removed','groomed','repotted','sucker_potted','in_bloom','disbudded','pest_treatment','measured','note')),
			ADD CONSTRAINT plant_events_measure_sane CHECK ((diameter_in IS NULL OR diameter_in > 0) AND (crowns IS NULL OR crowns >= 1))`);
		await queryInterface.addIndex('plant_events', ['plant_id', 'happened_on']);

		await queryInterface.createTable('plant_photos', {
			id: id(),
			plant_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'plants', key: 'id' },
				onDelete: 'CASCADE'
			},
			file_name: { type: Sequelize.STRING(80), allowNull: false, unique: true },
			mime_type: { type: Sequelize.STRING(40), allowNull: false },
			byte_size: { type: Sequelize.INTEGER, allowNull: false },
			caption: { type: Sequelize.STRING(160) },
			created_at: stamp()
		});
		await queryInterface.addIndex('plant_photos', ['plant_id']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('plant_photos');
		await queryInterface.dropTable('plant_events');
		await queryInterface.dropTable('plants');
	}
};
