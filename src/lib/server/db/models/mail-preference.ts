import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** Which kinds of optional e-mail a person wants; no row means all of them. */
export class MailPreference extends Model<
	InferAttributes<MailPreference>,
	InferCreationAttributes<MailPreference>
> {
	declare userId: string;
	declare reminders: boolean;
	declare results: boolean;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof MailPreference {
		return MailPreference.init(
			{
				userId: { type: DataTypes.UUID, primaryKey: true },
				reminders: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				results: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				updatedAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{
				sequelize,
				tableName: 'mail_preferences',
				underscored: true,
				timestamps: true,
				createdAt: false
			}
		);
	}
}
