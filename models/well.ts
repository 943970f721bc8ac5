import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { WellRole } from '@/lib/domain/well-roles';

/** One well (one cell): what it holds and the recording's cell properties; never deleted, only excluded. */
export class Well extends Model<InferAttributes<Well>, InferCreationAttributes<Well>> {
  declare id: CreationOptional<string>;
  declare plateId: string;
  declare position: string;
  declare rowIndex: number;
  declare columnIndex: number;
  declare role: WellRole;
  declare compoundId: string | null;
  declare batchId: string | null;
  declare concentration_uM: number | null;
  declare sealResistance_GOhm: number | null;
  declare seriesResistance_MOhm: number | null;
  declare capacitance_pF: number | null;
  declare excluded: CreationOptional<boolean>;
  declare exclusionReason: string | null;
  declare excludedBy: string | null;
  declare excludedAt: Date | null;

  static initModel(sequelize: Sequelize): void {
    // A fresh object per attribute: Sequelize writes the column name into the definition it is given.
    const measure = () => ({ type: DataTypes.DOUBLE, allowNull: true });
    Well.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        plateId: { type: DataTypes.UUID, allowNull: false },
        position: { type: DataTypes.TEXT, allowNull: false },
        rowIndex: { type: DataTypes.SMALLINT, allowNull: false },
        columnIndex: { type: DataTypes.SMALLINT, allowNull: false },
        role: { type: DataTypes.TEXT, allowNull: false },
        compoundId: { type: DataTypes.UUID, allowNull: true },
        batchId: { type: DataTypes.UUID, allowNull: true },
        concentration_uM: { ...measure(), field: 'concentration_um' },
        sealResistance_GOhm: { ...measure(), field: 'seal_resistance_gohm' },
        seriesResistance_MOhm: { ...measure(), field: 'series_resistance_mohm' },
        capacitance_pF: { ...measure(), field: 'capacitance_pf' },
        excluded: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        exclusionReason: { type: DataTypes.TEXT, allowNull: true },
        excludedBy: { type: DataTypes.UUID, allowNull: true },
        excludedAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, tableName: 'wells', underscored: true, timestamps: false },
    );
  }
}
