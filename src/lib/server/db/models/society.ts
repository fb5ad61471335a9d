import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A plant society that holds shows. */
export class Society extends Model<InferAttributes<Society>, InferCreationAttributes<Society>> {
	declare id: CreationOptional<string>;
	declare name: string;
	declare slug: string;
	declare currency: CreationOptional<string>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Society {
		return Society.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING(160), allowNull: false },
				slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
				currency: { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'USD' },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'societies', underscored: true, timestamps: false }
		);
	}
}
