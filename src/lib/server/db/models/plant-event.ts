import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { PlantEventKind } from '../../../domain/readiness';

/** One dated event of a plant's log (groomed, in bloom, measured, sucker potted up...). */
export class PlantEvent extends Model<
	InferAttributes<PlantEvent>,
	InferCreationAttributes<PlantEvent>
> {
	declare id: CreationOptional<string>;
	declare plantId: ForeignKey<string>;
	declare kind: PlantEventKind;
	declare happenedOn: string;
	declare diameterIn: string | null;
	declare crowns: number | null;
	declare potSizeIn: string | null;
	declare childPlantId: string | null;
	declare note: string | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof PlantEvent {
		return PlantEvent.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				kind: { type: DataTypes.STRING(24), allowNull: false },
				happenedOn: { type: DataTypes.DATEONLY, allowNull: false },
				diameterIn: { type: DataTypes.DECIMAL(5, 2) },
				crowns: { type: DataTypes.INTEGER },
				potSizeIn: { type: DataTypes.DECIMAL(4, 2) },
				childPlantId: { type: DataTypes.UUID },
				note: { type: DataTypes.STRING(500) },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'plant_events', underscored: true, timestamps: false }
		);
	}
}
