import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** An electronic signature: who signed what (by SHA-256 of its content), meaning, comment and time. */
export class Signature extends Model<InferAttributes<Signature>, InferCreationAttributes<Signature>> {
  declare id: CreationOptional<string>;
  declare signerId: string;
  declare meaning: string;
  declare comment: CreationOptional<string>;
  declare entityType: string;
  declare entityId: string;
  declare contentSha256: string;
  declare signedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Signature.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        signerId: { type: DataTypes.UUID, allowNull: false },
        meaning: { type: DataTypes.TEXT, allowNull: false },
        comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        entityType: { type: DataTypes.TEXT, allowNull: false },
        entityId: { type: DataTypes.UUID, allowNull: false },
        contentSha256: { type: DataTypes.CHAR(64), allowNull: false },
        signedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'signatures', underscored: true, timestamps: false },
    );
  }
}
