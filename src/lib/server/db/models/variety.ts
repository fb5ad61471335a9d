import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A named variety (or species) in a society's registry, with its declared traits. */
export class Variety extends Model<InferAttributes<Variety>, InferCreationAttributes<Variety>> {
	declare id: CreationOptional<string>;
	declare societyId: ForeignKey<string>;
	declare name: string;
	declare hybridizer: string | null;
	declare habit: 'single_crown' | 'trailer';
	declare sizeClass: 'miniature' | 'semiminiature' | 'standard' | 'large';
	declare blossomType: string;
	declare blossomColours: string[];
	declare foliage: 'plain' | 'variegated';
	declare isSpecies: boolean;
	declare description: string | null;
	/** African violet, or a gesneriad genus (`PLANT_GROUPS` in domain/plant-groups). */
	declare plantGroup: CreationOptional<string>;
	/** How it grows, among its group's forms; a violet's is its habit (the default, by trigger). */
	declare growthForm: CreationOptional<string>;
	/** A species' botanical name, like Sinningia pusilla; null for a named hybrid. */
	declare botanicalName: string | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Variety {
		return Variety.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING(120), allowNull: false },
				hybridizer: { type: DataTypes.STRING(120) },
				habit: { type: DataTypes.STRING(16), allowNull: false },
				sizeClass: { type: DataTypes.STRING(16), allowNull: false },
				blossomType: { type: DataTypes.STRING(24), allowNull: false },
				blossomColours: {
					type: DataTypes.ARRAY(DataTypes.STRING(40)),
					allowNull: false,
					defaultValue: []
				},
				foliage: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'plain' },
				isSpecies: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				description: { type: DataTypes.TEXT },
				plantGroup: {
					type: DataTypes.STRING(32),
					allowNull: false,
					defaultValue: 'african_violet'
				},
				growthForm: { type: DataTypes.STRING(24) },
				botanicalName: { type: DataTypes.STRING(160) },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'varieties', underscored: true, timestamps: true }
		);
	}
}
