import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { EntryNumberForm } from '../../../domain/entry-numbers';
import type { DeskEntriesUntil } from '../../../domain/desk-window';

/** A judged show held by a society, with its dates and rules. */
export class Show extends Model<InferAttributes<Show>, InferCreationAttributes<Show>> {
	declare id: CreationOptional<string>;
	declare societyId: ForeignKey<string>;
	declare name: string;
	declare slug: string;
	declare venue: string | null;
	declare entriesOpen: string;
	declare entriesClose: string;
	declare entryDay: string;
	declare judgingDay: string;
	declare publicHours: string | null;
	declare possessionMonths: CreationOptional<number>;
	declare maxEntriesPerClass: CreationOptional<number>;
	declare maxEntriesPerVariety: CreationOptional<number>;
	declare requireGoodStanding: CreationOptional<boolean>;
	declare awardRules: CreationOptional<Record<string, unknown>>;
	declare panelScoreMethod: CreationOptional<'mean' | 'consensus'>;
	declare nextEntryNumber: CreationOptional<number>;
	declare entryFeeCents: CreationOptional<number>;
	declare entryFeeRefund: CreationOptional<'none' | 'until_entries_close' | 'until_entry_day'>;
	declare generalRules: CreationOptional<string | null>;
	declare committee: CreationOptional<string | null>;
	declare deskEntriesUntil: CreationOptional<DeskEntriesUntil>;
	declare entryNumberForm: CreationOptional<EntryNumberForm>;
	declare entryNumberSeed: CreationOptional<number | null>;
	declare entryNumberDigits: CreationOptional<number | null>;
	declare entryNumbersFixedAt: CreationOptional<Date | null>;
	/** Whether exhibitors see the points lost per criterion once results are published. */
	declare sharePointsLost: CreationOptional<boolean>;
	declare schedulePublishedAt: Date | null;
	declare resultsPublishedAt: Date | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Show {
		return Show.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING(160), allowNull: false },
				slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
				venue: { type: DataTypes.STRING(240) },
				entriesOpen: { type: DataTypes.DATEONLY, allowNull: false },
				entriesClose: { type: DataTypes.DATEONLY, allowNull: false },
				entryDay: { type: DataTypes.DATEONLY, allowNull: false },
				judgingDay: { type: DataTypes.DATEONLY, allowNull: false },
				publicHours: { type: DataTypes.STRING(240) },
				possessionMonths: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 3 },
				maxEntriesPerClass: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 2 },
				maxEntriesPerVariety: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
				requireGoodStanding: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				awardRules: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
				panelScoreMethod: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'mean' },
				nextEntryNumber: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
				entryFeeCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				entryFeeRefund: { type: DataTypes.STRING(24), allowNull: false, defaultValue: 'none' },
				generalRules: { type: DataTypes.TEXT },
				committee: { type: DataTypes.TEXT },
				deskEntriesUntil: {
					type: DataTypes.STRING(24),
					allowNull: false,
					defaultValue: 'judging_starts'
				},
				entryNumberForm: {
					type: DataTypes.STRING(16),
					allowNull: false,
					defaultValue: 'show_sequence'
				},
				entryNumberSeed: { type: DataTypes.INTEGER },
				entryNumberDigits: { type: DataTypes.INTEGER },
				entryNumbersFixedAt: { type: DataTypes.DATE },
				sharePointsLost: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				schedulePublishedAt: { type: DataTypes.DATE },
				resultsPublishedAt: { type: DataTypes.DATE },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'shows', underscored: true, timestamps: true }
		);
	}
}
