'use strict';

/** Tables used by Auth.js through its Sequelize adapter (users, accounts, sessions, sign-in tokens). */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.sequelize.query('CREATE EXTENSION IF NOT EXISTS pgcrypto');
		await queryInterface.createTable('users', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			name: { type: Sequelize.STRING },
			email: { type: Sequelize.STRING, allowNull: false, unique: true },
			email_verified: { type: Sequelize.DATE },
			image: { type: Sequelize.STRING },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		await queryInterface.createTable('accounts', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			type: { type: Sequelize.STRING, allowNull: false },
			provider: { type: Sequelize.STRING, allowNull: false },
			provider_account_id: { type: Sequelize.STRING, allowNull: false },
			refresh_token: { type: Sequelize.STRING },
			access_token: { type: Sequelize.STRING },
			expires_at: { type: Sequelize.INTEGER },
			token_type: { type: Sequelize.STRING },
			scope: { type: Sequelize.STRING },
			id_token: { type: Sequelize.TEXT },
			session_state: { type: Sequelize.STRING },
			user_id: {
				type: Sequelize.UUID,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			}
		});
		await queryInterface.createTable('sessions', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			expires: { type: Sequelize.DATE, allowNull: false },
			session_token: { type: Sequelize.STRING, allowNull: false, unique: true },
			user_id: {
				type: Sequelize.UUID,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			}
		});
		await queryInterface.addIndex('sessions', ['user_id']);
		await queryInterface.createTable('verification_tokens', {
			token: { type: Sequelize.STRING, primaryKey: true },
			identifier: { type: Sequelize.STRING, allowNull: false },
			expires: { type: Sequelize.DATE, allowNull: false }
		});
		await queryInterface.addIndex('verification_tokens', ['identifier']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('verification_tokens');
		await queryInterface.dropTable('sessions');
		await queryInterface.dropTable('accounts');
		await queryInterface.dropTable('users');
	}
};
