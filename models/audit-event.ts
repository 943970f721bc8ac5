import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** One entry of the append-only audit trail (the database refuses UPDATE and DELETE). */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>;
  declare occurredAt: CreationOptional<Date>;
  declare actorId: string | null;
  declare action: string;
  declare entityType: string;
  declare entityId: string | null;
  declare before: unknown;
  declare after: unknown;
  declare reason: string | null;
  declare address: string | null;

  static initModel(sequelize: Sequelize): void {
    AuditEvent.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        occurredAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        actorId: { type: DataTypes.UUID, allowNull: true },
        action: { type: DataTypes.TEXT, allowNull: false },
        entityType: { type: DataTypes.TEXT, allowNull: false },
        entityId: { type: DataTypes.TEXT, allowNull: true },
        before: { type: DataTypes.JSONB, allowNull: true },
        after: { type: DataTypes.JSONB, allowNull: true },
        reason: { type: DataTypes.TEXT, allowNull: true },
        address: { type: DataTypes.TEXT, allowNull: true },
      },
      { sequelize, tableName: 'audit_events', underscored: true, timestamps: false },
    );
  }
}
