import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A judging panel of a show: its judges score the classes assigned to it; a clerk may help. */
export class Panel extends Model<InferAttributes<Panel>, InferCreationAttributes<Panel>> {
	declare id: CreationOptional<string>;
	declare showId: ForeignKey<string>;
	declare name: string;
	declare clerkId: string | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Panel {
		return Panel.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING(80), allowNull: false },
				clerkId: { type: DataTypes.UUID },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'panels', underscored: true, timestamps: false }
		);
	}
}
