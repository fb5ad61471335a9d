import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A division of a show schedule (horticulture, design, ...), holding classes. */
export class Division extends Model<InferAttributes<Division>, InferCreationAttributes<Division>> {
	declare id: CreationOptional<string>;
	declare showId: ForeignKey<string>;
	declare code: string;
	declare name: string;
	declare kind: CreationOptional<'horticulture' | 'design' | 'other'>;
	declare position: CreationOptional<number>;

	static initModel(sequelize: Sequelize): typeof Division {
		return Division.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				code: { type: DataTypes.STRING(8), allowNull: false },
				name: { type: DataTypes.STRING(160), allowNull: false },
				kind: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'horticulture' },
				position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 }
			},
			{ sequelize, tableName: 'divisions', underscored: true, timestamps: false }
		);
	}
}
