import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { PlantKind } from '../../../domain/eligibility';
import type { RootType } from '../../../domain/plant-groups';

/** A class of a show schedule with its structured eligibility rules. */
export class ShowClass extends Model<
	InferAttributes<ShowClass>,
	InferCreationAttributes<ShowClass>
> {
	declare id: CreationOptional<string>;
	declare showId: ForeignKey<string>;
	declare divisionId: ForeignKey<string>;
	declare scaleId: ForeignKey<string> | null;
	declare code: string;
	declare name: string;
	declare description: string | null;
	declare position: CreationOptional<number>;
	declare habit: CreationOptional<'single_crown' | 'trailer' | 'any'>;
	declare sizeClasses: CreationOptional<string[]>;
	declare blossomTypes: CreationOptional<string[]>;
	declare blossomColours: CreationOptional<string[]>;
	declare foliage: CreationOptional<'plain' | 'variegated' | 'any'>;
	declare minCrowns: number | null;
	declare maxCrowns: number | null;
	declare collectionSize: number | null;
	declare speciesOnly: CreationOptional<boolean>;
	declare maxDiameterIn: string | null;
	/** Null: the show's possession period applies. */
	declare possessionMonths: number | null;
	/** Null: the show's limit of entries per exhibitor in a class applies. */
	declare maxEntriesPerExhibitor: number | null;
	/** Null: the show's limit of entries per variety applies. */
	declare maxEntriesPerVariety: number | null;
	/** Largest pot, inches across the rim; null = no limit stated. */
	declare maxPotIn: string | null;
	declare plantKind: CreationOptional<PlantKind>;
	/** Genus groups (keys of `PLANT_GROUPS`); empty = any. */
	declare genera: CreationOptional<string[]>;
	declare growthForms: CreationOptional<string[]>;
	declare rootTypes: CreationOptional<RootType[]>;

	static initModel(sequelize: Sequelize): typeof ShowClass {
		const texts = () => ({
			type: DataTypes.ARRAY(DataTypes.STRING(40)),
			allowNull: false,
			defaultValue: []
		});
		return ShowClass.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				code: { type: DataTypes.STRING(8), allowNull: false },
				name: { type: DataTypes.STRING(160), allowNull: false },
				description: { type: DataTypes.TEXT },
				position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				habit: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'any' },
				sizeClasses: texts(),
				blossomTypes: texts(),
				blossomColours: texts(),
				foliage: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'any' },
				minCrowns: { type: DataTypes.INTEGER },
				maxCrowns: { type: DataTypes.INTEGER },
				collectionSize: { type: DataTypes.INTEGER },
				speciesOnly: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				maxDiameterIn: { type: DataTypes.DECIMAL(5, 2) },
				possessionMonths: { type: DataTypes.INTEGER },
				maxEntriesPerExhibitor: { type: DataTypes.INTEGER },
				maxEntriesPerVariety: { type: DataTypes.INTEGER },
				maxPotIn: { type: DataTypes.DECIMAL(5, 2) },
				plantKind: { type: DataTypes.STRING(24), allowNull: false, defaultValue: 'any' },
				genera: texts(),
				growthForms: texts(),
				rootTypes: texts()
			},
			{
				sequelize,
				tableName: 'classes',
				modelName: 'showClass',
				underscored: true,
				timestamps: false
			}
		);
	}
}
