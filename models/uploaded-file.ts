import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** An instrument export exactly as uploaded, with its SHA-256 (unique per screen). */
export class UploadedFile extends Model<
  InferAttributes<UploadedFile>,
  InferCreationAttributes<UploadedFile>
> {
  declare id: CreationOptional<string>;
  declare screenId: string;
  declare filename: string;
  declare mediaType: string;
  declare sizeBytes: number;
  declare sha256: string;
  declare content: Buffer;
  declare uploadedBy: string;
  declare uploadedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    UploadedFile.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        screenId: { type: DataTypes.UUID, allowNull: false },
        filename: { type: DataTypes.TEXT, allowNull: false },
        mediaType: { type: DataTypes.TEXT, allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        sha256: { type: DataTypes.CHAR(64), allowNull: false },
        content: { type: DataTypes.BLOB, allowNull: false },
        uploadedBy: { type: DataTypes.UUID, allowNull: false },
        uploadedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'uploaded_files', underscored: true, timestamps: false },
    );
  }
}
