import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A period a society's members pay dues for: paying it makes their dues paid through `endsOn`. */
export class DuesPeriod extends Model<
	InferAttributes<DuesPeriod>,
	InferCreationAttributes<DuesPeriod>
> {
	declare id: CreationOptional<string>;
	declare societyId: ForeignKey<string>;
	declare label: string;
	declare amountCents: number;
	declare startsOn: string;
	declare endsOn: string;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof DuesPeriod {
		return DuesPeriod.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				label: { type: DataTypes.STRING(120), allowNull: false },
				amountCents: { type: DataTypes.INTEGER, allowNull: false },
				startsOn: { type: DataTypes.DATEONLY, allowNull: false },
				endsOn: { type: DataTypes.DATEONLY, allowNull: false },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'dues_periods', underscored: true, timestamps: false }
		);
	}
}
