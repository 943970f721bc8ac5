import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A registered compound; its identifier is unique regardless of case. */
export class Compound extends Model<InferAttributes<Compound>, InferCreationAttributes<Compound>> {
  declare id: CreationOptional<string>;
  declare identifier: string;
  declare name: CreationOptional<string>;
  declare smiles: CreationOptional<string>;
  declare molecularWeight: number | null;
  declare createdBy: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Compound.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        identifier: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        smiles: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        molecularWeight: { type: DataTypes.DOUBLE, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'compounds', underscored: true },
    );
  }
}
