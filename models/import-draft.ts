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
 * An upload read and parsed once, at inspect (lib/plates/import-drafts.ts): its owner's only, until it
 * expires. Preview and commit take its sheets; the commit consumes it (consumedAt, plateId) and drops the
 * sheets and bytes in the transaction that stores the plate.
 */
export class ImportDraft extends Model<InferAttributes<ImportDraft>, InferCreationAttributes<ImportDraft>> {
  declare id: CreationOptional<string>;
  declare ownerId: string;
  declare screenId: string;
  declare filename: string;
  declare mediaType: string;
  declare sha256: string;
  declare sizeBytes: number;
  /** The parsed sheets as plain values (SheetData[]); null once consumed. */
  declare sheets: unknown;
  /** The file exactly as uploaded, for the stored file record; null once consumed. */
  declare bytes: Buffer | null;
  declare createdAt: CreationOptional<Date>;
  declare expiresAt: Date;
  declare consumedAt: Date | null;
  declare plateId: string | null;
  /** Every plate stored from one file, the first being plateId (a file may hold several plates); null before. */
  declare plateIds: CreationOptional<string[] | null>;
  /** Set while the draft waits for compounds to be registered (lib/compounds/waiting-imports.ts). */
  declare waitingSince: CreationOptional<Date | null>;
  /** The file's identifiers the registry lacked when it began to wait. */
  declare waitingFor: CreationOptional<string[] | null>;
  /** The sheet, mapping, format and label its owner chose, to resume with. */
  declare waitingChoice: CreationOptional<object | null>;

  static initModel(sequelize: Sequelize): void {
    ImportDraft.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        ownerId: { type: DataTypes.UUID, allowNull: false },
        screenId: { type: DataTypes.UUID, allowNull: false },
        filename: { type: DataTypes.TEXT, allowNull: false },
        mediaType: { type: DataTypes.TEXT, allowNull: false },
        sha256: { type: DataTypes.CHAR(64), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        sheets: { type: DataTypes.JSONB, allowNull: true },
        bytes: { type: DataTypes.BLOB, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        consumedAt: { type: DataTypes.DATE, allowNull: true },
        plateId: { type: DataTypes.UUID, allowNull: true },
        plateIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: true },
        waitingSince: { type: DataTypes.DATE, allowNull: true },
        waitingFor: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: true },
        waitingChoice: { type: DataTypes.JSONB, allowNull: true },
      },
      { sequelize, tableName: 'import_drafts', underscored: true, timestamps: false },
    );
  }
}
