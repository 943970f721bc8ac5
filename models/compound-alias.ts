import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/**
 * Another name of a registered compound, as an instrument file writes it (lib/compounds/aliases.ts):
 * unique regardless of case, never a registered identifier; every import resolves it to its compound.
 */
export class CompoundAlias extends Model<
  InferAttributes<CompoundAlias>,
  InferCreationAttributes<CompoundAlias>
> {
  declare id: CreationOptional<string>;
  declare alias: string;
  declare compoundId: string;
  declare createdBy: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    CompoundAlias.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        alias: { type: DataTypes.TEXT, allowNull: false },
        compoundId: { type: DataTypes.UUID, allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'compound_aliases', underscored: true, timestamps: false },
    );
  }
}
