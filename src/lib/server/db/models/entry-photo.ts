import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A photo of an entry; the file lives in the upload folder under a generated name. */
export class EntryPhoto extends Model<
	InferAttributes<EntryPhoto>,
	InferCreationAttributes<EntryPhoto>
> {
	declare id: CreationOptional<string>;
	declare entryId: ForeignKey<string>;
	declare uploadedBy: string;
	declare fileName: string;
	declare contentType: string;
	declare bytes: number;
	declare width: number | null;
	declare height: number | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof EntryPhoto {
		return EntryPhoto.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				uploadedBy: { type: DataTypes.UUID, allowNull: false },
				fileName: { type: DataTypes.STRING(80), allowNull: false, unique: true },
				contentType: { type: DataTypes.STRING(32), allowNull: false },
				bytes: { type: DataTypes.INTEGER, allowNull: false },
				width: { type: DataTypes.INTEGER },
				height: { type: DataTypes.INTEGER },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{
				sequelize,
				tableName: 'entry_photos',
				modelName: 'entryPhoto',
				underscored: true,
				timestamps: false
			}
		);
	}
}
