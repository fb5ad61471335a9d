import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A photo of a plant; the file lives in UPLOAD_DIR and is served only to the plant's owner. */
export class PlantPhoto extends Model<
	InferAttributes<PlantPhoto>,
	InferCreationAttributes<PlantPhoto>
> {
	declare id: CreationOptional<string>;
	declare plantId: ForeignKey<string>;
	declare fileName: string;
	declare mimeType: string;
	declare byteSize: number;
	declare caption: string | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof PlantPhoto {
		return PlantPhoto.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				fileName: { type: DataTypes.STRING(80), allowNull: false },
				mimeType: { type: DataTypes.STRING(40), allowNull: false },
				byteSize: { type: DataTypes.INTEGER, allowNull: false },
				caption: { type: DataTypes.STRING(160) },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'plant_photos', underscored: true, timestamps: false }
		);
	}
}
