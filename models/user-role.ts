import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import { ROLES, type Role } from '@/lib/domain/roles';

/** One role held by one user. */
export class UserRole extends Model<InferAttributes<UserRole>, InferCreationAttributes<UserRole>> {
  declare userId: string;
  declare role: Role;
  declare grantedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    UserRole.init(
      {
        userId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        role: {
          type: DataTypes.TEXT,
          allowNull: false,
          primaryKey: true,
          validate: { isIn: [ROLES as unknown as string[]] },
        },
        grantedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'user_roles', underscored: true, timestamps: false },
    );
  }
}
