import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A judge sitting on a panel. */
export class PanelJudge extends Model<
	InferAttributes<PanelJudge>,
	InferCreationAttributes<PanelJudge>
> {
	declare panelId: string;
	declare userId: string;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof PanelJudge {
		return PanelJudge.init(
			{
				panelId: { type: DataTypes.UUID, primaryKey: true },
				userId: { type: DataTypes.UUID, primaryKey: true },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'panel_judges', underscored: true, timestamps: false }
		);
	}
}
