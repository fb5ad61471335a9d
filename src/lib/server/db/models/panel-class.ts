import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A class assigned to a panel; a class has one panel at most. */
export class PanelClass extends Model<
	InferAttributes<PanelClass>,
	InferCreationAttributes<PanelClass>
> {
	declare classId: string;
	declare panelId: string;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof PanelClass {
		return PanelClass.init(
			{
				classId: { type: DataTypes.UUID, primaryKey: true },
				panelId: { type: DataTypes.UUID, allowNull: false },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'panel_classes', underscored: true, timestamps: false }
		);
	}
}
