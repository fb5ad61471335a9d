import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { ObtainedHow } from '../../../domain/readiness';

/** A plant of a member's own collection; private to its owner. */
export class Plant extends Model<InferAttributes<Plant>, InferCreationAttributes<Plant>> {
	declare id: CreationOptional<string>;
	declare ownerId: ForeignKey<string>;
	declare varietyId: ForeignKey<string>;
	declare label: string | null;
	declare obtainedHow: ObtainedHow;
	declare obtainedOn: string;
	declare parentId: string | null;
	declare potSizeIn: string | null;
	declare notes: string | null;
	declare goneOn: string | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Plant {
		return Plant.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				label: { type: DataTypes.STRING(80) },
				obtainedHow: { type: DataTypes.STRING(16), allowNull: false },
				obtainedOn: { type: DataTypes.DATEONLY, allowNull: false },
				parentId: { type: DataTypes.UUID },
				potSizeIn: { type: DataTypes.DECIMAL(4, 2) },
				notes: { type: DataTypes.TEXT },
				goneOn: { type: DataTypes.DATEONLY },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'plants', underscored: true, timestamps: true }
		);
	}
}
