import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import { NOTICE_KINDS, type NoticeKind } from '@/lib/domain/notices';

/** One notice in Gatewell for one person, written with the event it tells of (lib/notices/queue.ts). */
export class Notice extends Model<InferAttributes<Notice>, InferCreationAttributes<Notice>> {
  declare id: CreationOptional<string>;
  declare recipientId: string;
  declare kind: NoticeKind;
  declare title: string;
  declare bodyText: string;
  /** A path inside the app: the plate, the compound or the waiting import. */
  declare linkPath: string;
  declare plateId: string | null;
  declare signoffEventId: string | null;
  declare createdAt: CreationOptional<Date>;
  declare seenAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize): void {
    Notice.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        recipientId: { type: DataTypes.UUID, allowNull: false },
        kind: {
          type: DataTypes.TEXT,
          allowNull: false,
          validate: { isIn: [NOTICE_KINDS as unknown as string[]] },
        },
        title: { type: DataTypes.TEXT, allowNull: false },
        bodyText: { type: DataTypes.TEXT, allowNull: false },
        linkPath: { type: DataTypes.TEXT, allowNull: false },
        plateId: { type: DataTypes.UUID, allowNull: true },
        signoffEventId: { type: DataTypes.UUID, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        seenAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, tableName: 'notices', underscored: true, timestamps: false },
    );
  }
}
