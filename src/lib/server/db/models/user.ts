import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A person who can sign in. Shape required by the Auth.js Sequelize adapter. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	declare id: CreationOptional<string>;
	declare name: string | null;
	declare email: string;
	declare emailVerified: Date | null;
	declare image: string | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof User {
		return User.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING },
				email: { type: DataTypes.STRING, allowNull: false, unique: true },
				emailVerified: { type: DataTypes.DATE },
				image: { type: DataTypes.STRING },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'users', modelName: 'user', underscored: true, timestamps: false }
		);
	}
}
