import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export type PaymentPurpose = 'dues' | 'entry_fees';
export type PaymentStatus =
	'pending' | 'paid' | 'expired' | 'failed' | 'refunded' | 'partly_refunded';

/**
 * One payment through the hosted checkout: created 'pending' when the member starts paying, and
 * marked 'paid' only by a verified webhook from the payment service.
 */
export class Payment extends Model<InferAttributes<Payment>, InferCreationAttributes<Payment>> {
	declare id: CreationOptional<string>;
	declare societyId: ForeignKey<string>;
	declare userId: ForeignKey<string>;
	declare purpose: PaymentPurpose;
	declare status: CreationOptional<PaymentStatus>;
	declare amountCents: number;
	declare unitAmountCents: number;
	declare currency: string;
	declare description: string;
	declare duesPeriodId: string | null;
	declare showId: string | null;
	declare entryIds: CreationOptional<string[]>;
	declare checkoutSessionId: CreationOptional<string | null>;
	declare paymentIntentId: CreationOptional<string | null>;
	declare refundedCents: CreationOptional<number>;
	declare paidAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Payment {
		return Payment.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				purpose: { type: DataTypes.STRING(16), allowNull: false },
				status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pending' },
				amountCents: { type: DataTypes.INTEGER, allowNull: false },
				unitAmountCents: { type: DataTypes.INTEGER, allowNull: false },
				currency: { type: DataTypes.STRING(3), allowNull: false },
				description: { type: DataTypes.STRING(240), allowNull: false },
				duesPeriodId: { type: DataTypes.UUID },
				showId: { type: DataTypes.UUID },
				entryIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
				checkoutSessionId: { type: DataTypes.STRING(255), unique: true },
				paymentIntentId: { type: DataTypes.STRING(255) },
				refundedCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				paidAt: { type: DataTypes.DATE },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'payments', underscored: true, timestamps: true }
		);
	}
}
