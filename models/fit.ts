import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

import type { BlockReadout, FitModel, FitStatus } from '@/lib/domain/fits';

/** The Hill fit of one compound on one target of one plate. */
export class Fit extends Model<InferAttributes<Fit>, InferCreationAttributes<Fit>> {
  declare id: CreationOptional<string>;
  declare plateId: string;
  declare compoundId: string;
  declare targetId: string;
  /** Which of the target's block readouts was fitted (tonic unless the screen names a use-dependent one). */
  declare readout: CreationOptional<BlockReadout>;
  declare model: CreationOptional<FitModel>;
  declare status: FitStatus;
  declare message: CreationOptional<string>;
  declare ic50_uM: number | null;
  declare ic50CiLow_uM: number | null;
  declare ic50CiHigh_uM: number | null;
  declare ic50LowerBound_uM: number | null;
  declare log10Ic50Se: number | null;
  declare hill: number | null;
  declare top: number | null;
  declare bottom: number | null;
  declare r2: number | null;
  declare residualSd: number | null;
  declare n: number;
  declare flags: CreationOptional<{ code: string; message: string }[]>;
  /** The least-squares estimate behind the result (parameters, SEs, RSS), for plots and review. */
  declare estimate: Record<string, unknown> | null;
  declare computedBy: string | null;
  declare computedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    // A fresh object per attribute: Sequelize writes the column name into the definition it is given.
    const value = () => ({ type: DataTypes.DOUBLE, allowNull: true });
    Fit.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        plateId: { type: DataTypes.UUID, allowNull: false },
        compoundId: { type: DataTypes.UUID, allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        readout: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'tonic' },
        model: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'hill2' },
        status: { type: DataTypes.TEXT, allowNull: false },
        message: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        ic50_uM: { ...value(), field: 'ic50_um' },
        ic50CiLow_uM: { ...value(), field: 'ic50_ci_low_um' },
        ic50CiHigh_uM: { ...value(), field: 'ic50_ci_high_um' },
        ic50LowerBound_uM: { ...value(), field: 'ic50_lower_bound_um' },
        log10Ic50Se: { ...value(), field: 'log10_ic50_se' },
        hill: value(),
        top: value(),
        bottom: value(),
        r2: value(),
        residualSd: value(),
        n: { type: DataTypes.INTEGER, allowNull: false },
        flags: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        estimate: { type: DataTypes.JSONB, allowNull: true },
        computedBy: { type: DataTypes.UUID, allowNull: true },
        computedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'fits', underscored: true, timestamps: false },
    );
  }
}
