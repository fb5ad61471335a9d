import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** One criterion of a scale of points and the most points it can give. */
export interface ScaleCriterion {
	key: string;
	label: string;
	maxPoints: number;
}

/** A scale of points that judges a class; its criteria are data set by the society. */
export class Scale extends Model<InferAttributes<Scale>, InferCreationAttributes<Scale>> {
	declare id: CreationOptional<string>;
	declare societyId: ForeignKey<string> | null;
	declare name: string;
	declare criteria: ScaleCriterion[];
	/** 1 for a new scale; a new version of a scale that scored sheets use gets the next number. */
	declare version: CreationOptional<number>;
	/** The scale this version replaces, or null. */
	declare replacesId: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Scale {
		return Scale.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				name: { type: DataTypes.STRING(120), allowNull: false },
				criteria: { type: DataTypes.JSONB, allowNull: false },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
				replacesId: { type: DataTypes.UUID },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'scales', underscored: true, timestamps: false }
		);
	}
}
