import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A batch (lot) of a compound with its purity, stock concentration and solvent. */
export class Batch extends Model<InferAttributes<Batch>, InferCreationAttributes<Batch>> {
  declare id: CreationOptional<string>;
  declare compoundId: string;
  declare lot: string;
  declare purity_percent: number | null;
  declare stockConcentration_mM: number | null;
  declare solvent: CreationOptional<string>;
  declare createdBy: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Batch.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        compoundId: { type: DataTypes.UUID, allowNull: false },
        lot: { type: DataTypes.TEXT, allowNull: false },
        purity_percent: { type: DataTypes.DOUBLE, allowNull: true, field: 'purity_percent' },
        stockConcentration_mM: { type: DataTypes.DOUBLE, allowNull: true, field: 'stock_concentration_mm' },
        solvent: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'DMSO' },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'batches', underscored: true },
    );
  }
}
