import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { Role } from '../../../roles';

/** A person's membership of a society, with the roles they hold there. */
export class Membership extends Model<
	InferAttributes<Membership>,
	InferCreationAttributes<Membership>
> {
	declare id: CreationOptional<string>;
	declare societyId: ForeignKey<string>;
	declare userId: ForeignKey<string>;
	declare roles: Role[];
	declare household: string | null;
	declare duesPaidThrough: string | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Membership {
		return Membership.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				roles: { type: DataTypes.ARRAY(DataTypes.STRING(16)), allowNull: false, defaultValue: [] },
				household: { type: DataTypes.STRING(120) },
				duesPaidThrough: { type: DataTypes.DATEONLY },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'memberships', underscored: true, timestamps: false }
		);
	}
}
