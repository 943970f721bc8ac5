import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { PlateState } from '@/lib/domain/plate-states';

/** One signed transition of a plate's state. */
export class SignoffEvent extends Model<
  InferAttributes<SignoffEvent>,
  InferCreationAttributes<SignoffEvent>
> {
  declare id: CreationOptional<string>;
  declare plateId: string;
  declare signatureId: string;
  declare fromState: PlateState;
  declare toState: PlateState;
  declare occurredAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    SignoffEvent.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        plateId: { type: DataTypes.UUID, allowNull: false },
        signatureId: { type: DataTypes.UUID, allowNull: false },
        fromState: { type: DataTypes.TEXT, allowNull: false },
        toState: { type: DataTypes.TEXT, allowNull: false },
        occurredAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'signoff_events', underscored: true, timestamps: false },
    );
  }
}
