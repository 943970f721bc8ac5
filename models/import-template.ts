import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A saved column mapping for one instrument's export layout. */
export class ImportTemplate extends Model<
  InferAttributes<ImportTemplate>,
  InferCreationAttributes<ImportTemplate>
> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare mapping: Record<string, unknown>;
  /** Normalised header texts of the layout's well sheet (lib/imports/fingerprint.ts); null for older templates. */
  declare fingerprint: CreationOptional<string | null>;
  declare createdBy: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ImportTemplate.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        mapping: { type: DataTypes.JSONB, allowNull: false },
        fingerprint: { type: DataTypes.TEXT, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'import_templates', underscored: true },
    );
  }
}
