import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export type RefundStatus = 'requested' | 'sent' | 'succeeded' | 'failed';

/**
 * Money given back from a payment (the fee of a withdrawn entry). 'requested' rows are sent to the
 * payment service after the withdrawal commits; 'succeeded' is set only by a verified webhook.
 */
export class Refund extends Model<InferAttributes<Refund>, InferCreationAttributes<Refund>> {
	declare id: CreationOptional<string>;
	declare paymentId: ForeignKey<string>;
	declare entryId: string | null;
	declare amountCents: number;
	declare status: CreationOptional<RefundStatus>;
	declare stripeRefundId: CreationOptional<string | null>;
	declare lastError: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof Refund {
		return Refund.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				entryId: { type: DataTypes.UUID },
				amountCents: { type: DataTypes.INTEGER, allowNull: false },
				status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'requested' },
				stripeRefundId: { type: DataTypes.STRING(255), unique: true },
				lastError: { type: DataTypes.TEXT },
				createdAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'refunds', underscored: true, timestamps: true }
		);
	}
}
