import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { PaperSize } from '../../../domain/society-settings';
import type { LengthUnit } from '../../../domain/units';

/** A plant society that holds shows, with the settings its pages and documents follow. */
export class Society extends Model<InferAttributes<Society>, InferCreationAttributes<Society>> {
	declare id: CreationOptional<string>;
	declare name: string;
	declare slug: string;
	declare currency: CreationOptional<string>;
	declare country: CreationOptional<string>;
	declare lengthUnit: CreationOptional<LengthUnit>;
	declare paperSize: CreationOptional<PaperSize>;
	declare timeZone: CreationOptional<string>;
	/** The award rules new shows of the society start from (AwardRules; empty: the defaults). */
	declare defaultAwardRules: CreationOptional<Record<string, unknown>>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Society {
		return Society.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING(160), allowNull: false },
				slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
				currency: { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'USD' },
				country: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'US' },
				lengthUnit: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'in' },
				paperSize: { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'letter' },
				timeZone: {
					type: DataTypes.STRING(64),
					allowNull: false,
					defaultValue: 'America/New_York'
				},
				defaultAwardRules: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'societies', underscored: true, timestamps: true }
		);
	}
}
