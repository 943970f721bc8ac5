import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** One sign-in attempt, kept to throttle guessing per account and per address. */
export class LoginAttempt extends Model<
  InferAttributes<LoginAttempt>,
  InferCreationAttributes<LoginAttempt>
> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare address: string;
  declare succeeded: boolean;
  declare attemptedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    LoginAttempt.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.TEXT, allowNull: false },
        address: { type: DataTypes.TEXT, allowNull: false },
        succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
        attemptedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'login_attempts', underscored: true, timestamps: false },
    );
  }
}
