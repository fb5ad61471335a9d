import { DataTypes, Model, type Sequelize } from 'sequelize';

/** A linked sign-in account (unused by e-mail sign-in, but part of the Auth.js schema). */
export class Account extends Model {
	static initModel(sequelize: Sequelize): typeof Account {
		return Account.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				type: { type: DataTypes.STRING, allowNull: false },
				provider: { type: DataTypes.STRING, allowNull: false },
				providerAccountId: { type: DataTypes.STRING, allowNull: false },
				refresh_token: { type: DataTypes.STRING },
				access_token: { type: DataTypes.STRING },
				expires_at: { type: DataTypes.INTEGER },
				token_type: { type: DataTypes.STRING },
				scope: { type: DataTypes.STRING },
				id_token: { type: DataTypes.TEXT },
				session_state: { type: DataTypes.STRING },
				userId: { type: DataTypes.UUID }
			},
			{
				sequelize,
				tableName: 'accounts',
				modelName: 'account',
				underscored: true,
				timestamps: false
			}
		);
	}
}

/** A signed-in browser session, kept in the database. */
export class Session extends Model {
	declare id: string;
	declare expires: Date;
	declare sessionToken: string;
	declare userId: string;

	static initModel(sequelize: Sequelize): typeof Session {
		return Session.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				expires: { type: DataTypes.DATE, allowNull: false },
				sessionToken: { type: DataTypes.STRING, allowNull: false, unique: true },
				userId: { type: DataTypes.UUID }
			},
			{
				sequelize,
				tableName: 'sessions',
				modelName: 'session',
				underscored: true,
				timestamps: false
			}
		);
	}
}

/** A one-time sign-in link token; deleted when used. */
export class VerificationToken extends Model {
	declare token: string;
	declare identifier: string;
	declare expires: Date;

	static initModel(sequelize: Sequelize): typeof VerificationToken {
		return VerificationToken.init(
			{
				token: { type: DataTypes.STRING, primaryKey: true },
				identifier: { type: DataTypes.STRING, allowNull: false },
				expires: { type: DataTypes.DATE, allowNull: false }
			},
			{
				sequelize,
				tableName: 'verification_tokens',
				modelName: 'verificationToken',
				underscored: true,
				timestamps: false
			}
		);
	}
}
