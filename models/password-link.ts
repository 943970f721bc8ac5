import 'server-only';
import {
  DataTypes,
  Model,
  fn,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/**
 * One request for a link to choose a password. Every request is kept (for throttling and the record); only a
 * request for an active account has a user, a token (kept as its SHA-256) and an expiry.
 */
export class PasswordLink extends Model<
  InferAttributes<PasswordLink>,
  InferCreationAttributes<PasswordLink>
> {
  declare id: string;
  declare email: string;
  declare userId: CreationOptional<string | null>;
  declare tokenSha256: CreationOptional<Buffer | null>;
  /** Set by the database's clock (its default `now()`), never the app's. */
  declare requestedAt: CreationOptional<Date>;
  declare expiresAt: CreationOptional<Date | null>;
  declare usedAt: CreationOptional<Date | null>;
  declare address: CreationOptional<string | null>;

  static initModel(sequelize: Sequelize): void {
    PasswordLink.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        email: { type: DataTypes.TEXT, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: true },
        tokenSha256: { type: DataTypes.BLOB, allowNull: true },
        requestedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: fn('now') },
        expiresAt: { type: DataTypes.DATE, allowNull: true },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        address: { type: DataTypes.TEXT, allowNull: true },
      },
      { sequelize, tableName: 'password_links', underscored: true, timestamps: false },
    );
  }
}
