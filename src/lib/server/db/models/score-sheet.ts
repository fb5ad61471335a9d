import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { NotJudgedReason } from '../../../domain/scoring';

/** One judge's sheet for an entry, or the panel's consensus sheet; versioned for concurrent edits. */
export class ScoreSheet extends Model<
	InferAttributes<ScoreSheet>,
	InferCreationAttributes<ScoreSheet>
> {
	declare id: CreationOptional<string>;
	declare showId: string;
	declare entryId: string;
	declare kind: 'judge' | 'consensus';
	declare judgeId: string | null;
	declare deductions: Record<string, number>;
	declare comment: string;
	declare notJudgedReason: NotJudgedReason | null;
	declare notJudgedNote: string | null;
	declare judgesChoiceRank: number | null;
	declare version: number;
	declare updatedBy: string | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof ScoreSheet {
		return ScoreSheet.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				showId: { type: DataTypes.UUID, allowNull: false },
				entryId: { type: DataTypes.UUID, allowNull: false },
				kind: { type: DataTypes.STRING(16), allowNull: false },
				judgeId: { type: DataTypes.UUID },
				deductions: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
				comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				notJudgedReason: { type: DataTypes.STRING(24) },
				notJudgedNote: { type: DataTypes.STRING(200) },
				judgesChoiceRank: { type: DataTypes.INTEGER },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
				updatedBy: { type: DataTypes.UUID },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'score_sheets', underscored: true, timestamps: true }
		);
	}
}
