import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export type EntryFeeStatus = 'not_required' | 'due' | 'paid' | 'refund_pending' | 'refunded';

export type EntryStatus = 'entered' | 'checked_in' | 'scratched' | 'withdrawn';

/** A plant (or collection, or design) entered by an exhibitor in a class; known to judges only by number. */
export class Entry extends Model<InferAttributes<Entry>, InferCreationAttributes<Entry>> {
	declare id: CreationOptional<string>;
	declare showId: ForeignKey<string>;
	declare classId: ForeignKey<string>;
	declare exhibitorId: ForeignKey<string>;
	declare varietyId: ForeignKey<string> | null;
	declare collectionVarietyIds: CreationOptional<string[]>;
	declare title: string | null;
	declare number: number;
	declare acquiredOn: string | null;
	declare status: CreationOptional<EntryStatus>;
	declare measuredDiameterIn: string | null;
	declare measuredCrowns: number | null;
	declare potSizeIn: string | null;
	/** The longest leaf blade, in inches (a miniature Sinningia is sized by it); null if not measured. */
	declare measuredLeafIn: CreationOptional<string | null>;
	declare checkedInAt: Date | null;
	declare checkedInBy: string | null;
	declare feeStatus: CreationOptional<EntryFeeStatus>;
	declare feePaymentId: CreationOptional<string | null>;
	declare shownSizeClass: CreationOptional<
		'miniature' | 'semiminiature' | 'standard' | 'large' | null
	>;
	declare deskNote: CreationOptional<string | null>;
	declare enteredAtDeskBy: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Entry {
		return Entry.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				collectionVarietyIds: {
					type: DataTypes.ARRAY(DataTypes.UUID),
					allowNull: false,
					defaultValue: []
				},
				title: { type: DataTypes.STRING(160) },
				number: { type: DataTypes.INTEGER, allowNull: false },
				acquiredOn: { type: DataTypes.DATEONLY },
				status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'entered' },
				measuredDiameterIn: { type: DataTypes.DECIMAL(5, 2) },
				measuredCrowns: { type: DataTypes.INTEGER },
				potSizeIn: { type: DataTypes.DECIMAL(4, 2) },
				measuredLeafIn: { type: DataTypes.DECIMAL(4, 2) },
				checkedInAt: { type: DataTypes.DATE },
				checkedInBy: { type: DataTypes.UUID },
				feeStatus: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'not_required' },
				feePaymentId: { type: DataTypes.UUID },
				shownSizeClass: { type: DataTypes.STRING(16) },
				deskNote: { type: DataTypes.STRING(240) },
				enteredAtDeskBy: { type: DataTypes.UUID },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'entries', underscored: true, timestamps: true }
		);
	}
}
