import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/**
 * An exhibitor entered at the desk who had no account: the name, address and household the clerk
 * took down. Their entries belong to the person record `userId`; whoever signs in with `email`
 * signs in to that record and so finds the entries as their own (`claimedAt` says when first).
 */
export class WalkInExhibitor extends Model<
	InferAttributes<WalkInExhibitor>,
	InferCreationAttributes<WalkInExhibitor>
> {
	declare id: CreationOptional<string>;
	declare societyId: ForeignKey<string>;
	declare userId: ForeignKey<string>;
	declare name: string;
	declare email: string | null;
	declare household: string | null;
	declare createdBy: string | null;
	declare createdAt: CreationOptional<Date>;
	declare claimedAt: Date | null;

	static initModel(sequelize: Sequelize): typeof WalkInExhibitor {
		return WalkInExhibitor.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING(120), allowNull: false },
				email: { type: DataTypes.STRING(254) },
				household: { type: DataTypes.STRING(120) },
				createdBy: { type: DataTypes.UUID },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				claimedAt: { type: DataTypes.DATE }
			},
			{ sequelize, tableName: 'walk_in_exhibitors', underscored: true, timestamps: false }
		);
	}
}
