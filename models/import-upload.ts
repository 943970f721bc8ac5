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
 * A commit waiting for its plate-import job (lib/plates/import-jobs.ts): the commit request's fields and
 * either the file's bytes or the import draft that holds its parsed sheets. The job removes it in the
 * transaction that stores the plate.
 */
export class ImportUpload extends Model<
  InferAttributes<ImportUpload>,
  InferCreationAttributes<ImportUpload>
> {
  declare id: CreationOptional<string>;
  declare requestedBy: string;
  /** The uploader's network address, for the import's audit event. */
  declare address: string | null;
  /** The commit request without the file (screen, sheet, mapping, label …). */
  declare request: Record<string, unknown>;
  /** The file as sent to the commit; null when the commit names a draft. */
  declare bytes: Buffer | null;
  /** The import draft the commit names; null when it sent the file. */
  declare draftId: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ImportUpload.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        requestedBy: { type: DataTypes.UUID, allowNull: false },
        address: { type: DataTypes.TEXT, allowNull: true },
        request: { type: DataTypes.JSONB, allowNull: false },
        bytes: { type: DataTypes.BLOB, allowNull: true },
        draftId: { type: DataTypes.UUID, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'import_uploads', underscored: true, timestamps: false },
    );
  }
}
