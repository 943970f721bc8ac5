import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { BlockReadout } from '@/lib/domain/fits';

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
  /** Whether the file gave the block directly instead of the current after compound. */
  declare blockGiven: CreationOptional<boolean>;
  /** The block as the file gave it (a fraction; null when missing or not given). */
  declare givenBlock: CreationOptional<number | null>;
  /** The concentration of this application, for cumulative application; null: the well's. */
  declare concentration_uM: CreationOptional<number | null>;
  declare fractionalBlock: number | null;
  declare qcReasons: CreationOptional<QcReason[]>;
  /** Which of the target's block readouts this is (tonic unless the screen names a use-dependent one). */
  declare readout: CreationOptional<BlockReadout>;

  static initModel(sequelize: Sequelize): void {
    Readout.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        wellId: { type: DataTypes.UUID, allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        controlCurrent_pA: { type: DataTypes.DOUBLE, allowNull: true, field: 'control_current_pa' },
        compoundCurrent_pA: { type: DataTypes.DOUBLE, allowNull: true, field: 'compound_current_pa' },
        blockGiven: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        givenBlock: { type: DataTypes.DOUBLE, allowNull: true },
        concentration_uM: { type: DataTypes.DOUBLE, allowNull: true, field: 'concentration_um' },
        fractionalBlock: { type: DataTypes.DOUBLE, allowNull: true },
        qcReasons: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        readout: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'tonic' },
      },
      { sequelize, tableName: 'readouts', underscored: true, timestamps: false },
    );
  }
}
