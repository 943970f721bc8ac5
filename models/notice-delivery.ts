import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import { NOTICE_DELIVERIES, type NoticeDelivery } from '@/lib/domain/notices';

/** One person's choice of how notices reach them; no row means the default (e-mail and in Gatewell). */
export class NoticeDeliveryChoice extends Model<
  InferAttributes<NoticeDeliveryChoice>,
  InferCreationAttributes<NoticeDeliveryChoice>
> {
  declare userId: string;
  declare delivery: NoticeDelivery;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    NoticeDeliveryChoice.init(
      {
        userId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        delivery: {
          type: DataTypes.TEXT,
          allowNull: false,
          validate: { isIn: [NOTICE_DELIVERIES as unknown as string[]] },
        },
        updatedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'notice_delivery', underscored: true, timestamps: false },
    );
  }
}
