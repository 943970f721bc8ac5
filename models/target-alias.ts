import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** Another name a file gives one of a screen's targets ("hNav1.7 peak" for Nav1.7), remembered per screen. */
export class TargetAlias extends Model<InferAttributes<TargetAlias>, InferCreationAttributes<TargetAlias>> {
  declare id: CreationOptional<string>;
  declare screenId: string;
  declare targetId: string;
  /** As the file writes it. */
  declare alias: string;
  /** normaliseLabel(alias): what rows are matched on. */
  declare aliasKey: string;
  declare createdBy: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    TargetAlias.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        screenId: { type: DataTypes.UUID, allowNull: false },
        targetId: { type: DataTypes.UUID, allowNull: false },
        alias: { type: DataTypes.TEXT, allowNull: false },
        aliasKey: { type: DataTypes.TEXT, allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'target_aliases', underscored: true, updatedAt: false },
    );
  }
}
