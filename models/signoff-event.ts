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

/** A QC warning the signer was shown and acknowledged (lib/signoff/qc-warnings.ts). */
export interface AcknowledgedQcWarning {
  code: string;
  key: string;
  message: string;
}

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
  /** The round of the plate's sign-off (reworks before it); set by the database's trigger. */
  declare round: CreationOptional<number>;
  /** The QC warnings shown to the signer and acknowledged with the signature; empty when there were none. */
  declare qcWarnings: CreationOptional<AcknowledgedQcWarning[]>;

  static initModel(sequelize: Sequelize): void {
    SignoffEvent.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        plateId: { type: DataTypes.UUID, allowNull: false },
        signatureId: { type: DataTypes.UUID, allowNull: false },
        fromState: { type: DataTypes.TEXT, allowNull: false },
        toState: { type: DataTypes.TEXT, allowNull: false },
        occurredAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        round: { type: DataTypes.INTEGER, allowNull: true },
        qcWarnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [], field: 'qc_warnings' },
      },
      { sequelize, tableName: 'signoff_events', underscored: true, timestamps: false },
    );
  }
}
