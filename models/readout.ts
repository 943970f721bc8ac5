import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** One QC reason on a readout: a stable code and a message for people. */
export interface QcReason {
  code: string;
  message: string;
}

/** The currents of one target in one well, the fractional block computed from them, and QC reasons. */
export class Readout extends Model<InferAttributes<Readout>, InferCreationAttributes<Readout>> {
  declare id: CreationOptional<string>;
  declare wellId: string;
  declare targetId: string;
  declare controlCurrent_pA: number | null;
  declare compoundCurrent_pA: number | null;
  declare fractionalBlock: number | null;
  declare qcReasons: CreationOptional<QcReason[]>;

  static initModel(sequelize: Sequelize): void {
    Readout.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        wellId: { type: DataTypes.UUID, allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        controlCurrent_pA: { type: DataTypes.DOUBLE, allowNull: true, field: 'control_current_pa' },
        compoundCurrent_pA: { type: DataTypes.DOUBLE, allowNull: true, field: 'compound_current_pa' },
        fractionalBlock: { type: DataTypes.DOUBLE, allowNull: true },
        qcReasons: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      },
      { sequelize, tableName: 'readouts', underscored: true, timestamps: false },
    );
  }
}
