import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** One destructive or irreversible action, written in the transaction of the change itself. */
export class AuditEvent extends Model<
	InferAttributes<AuditEvent>,
	InferCreationAttributes<AuditEvent>
> {
	declare id: CreationOptional<string>;
	declare societyId: string | null;
	declare showId: string | null;
	declare actorId: string;
	declare actorLabel: string;
	declare action: string;
	declare targetKind: string;
	declare targetId: string;
	declare targetLabel: string;
	declare details: Record<string, unknown>;
	declare at: CreationOptional<Date>;

	static initModel(sequelize: Sequelize): typeof AuditEvent {
		return AuditEvent.init(
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				societyId: { type: DataTypes.UUID },
				showId: { type: DataTypes.UUID },
				actorId: { type: DataTypes.UUID, allowNull: false },
				actorLabel: { type: DataTypes.STRING(320), allowNull: false },
				action: { type: DataTypes.STRING(48), allowNull: false },
				targetKind: { type: DataTypes.STRING(32), allowNull: false },
				targetId: { type: DataTypes.STRING(64), allowNull: false },
				targetLabel: { type: DataTypes.STRING(200), allowNull: false },
				details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
				at: { type: DataTypes.DATE, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'audit_events', underscored: true, timestamps: false }
		);
	}
}
