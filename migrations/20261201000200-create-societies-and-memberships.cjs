'use strict';

/** Societies and who belongs to each, with the roles they hold there. */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.createTable('societies', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			name: { type: Sequelize.STRING(160), allowNull: false },
			slug: { type: Sequelize.STRING(80), allowNull: false, unique: true },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		await queryInterface.createTable('memberships', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			society_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'societies', key: 'id' },
				onDelete: 'CASCADE'
			},
			user_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			},
			roles: { type: Sequelize.ARRAY(Sequelize.STRING(16)), allowNull: false, defaultValue: [] },
			household: { type: Sequelize.STRING(120) },
			dues_paid_through: { type: Sequelize.DATEONLY },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		await queryInterface.addConstraint('memberships', {
			fields: ['society_id', 'user_id'],
			type: 'unique',
			name: 'memberships_society_user_unique'
		});
		await queryInterface.sequelize.query(
			`ALTER TABLE memberships ADD CONSTRAINT memberships_roles_known
			 CHECK (roles <@ ARRAY['admin','chair','clerk','judge','member']::varchar(16)[])`
		);
		await queryInterface.addIndex('memberships', ['user_id']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('memberships');
		await queryInterface.dropTable('societies');
	}
};
