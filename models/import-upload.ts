import 'server-only';
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * An uploaded export waiting for its plate-import job (lib/plates/import-jobs.ts): the commit request's
 * fields and the file's bytes. The job removes it in the transaction that stores the plate.
 */
export class ImportUpload extends Model<InferAttributes<ImportUpload>, InferCreationAttributes<ImportUpload>> {
  declare id: CreationOptional<string>;
  declare requestedBy: string;
  /** The uploader's network address, for the import's audit event. */
  declare address: string | null;
  /** The commit request without the file (screen, sheet, mapping, label …). */
  declare request: Record<string, unknown>;
  declare bytes: Buffer;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ImportUpload.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        requestedBy: { type: DataTypes.UUID, allowNull: false },
        address: { type: DataTypes.TEXT, allowNull: true },
        request: { type: DataTypes.JSONB, allowNull: false },
        bytes: { type: DataTypes.BLOB, allowNull: false },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'import_uploads', underscored: true, timestamps: false },
    );
  }
}
