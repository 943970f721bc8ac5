import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

import type { MailKind, MailState } from '@/lib/domain/mail';

/** One notification in the mail outbox: queued with the change that caused it, sent later with retries. */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<string>;
  declare kind: MailKind;
  declare plateId: string | null;
  declare signoffEventId: string | null;
  declare recipientId: string;
  declare toAddress: string;
  declare subject: string;
  declare bodyText: string;
  declare state: CreationOptional<MailState>;
  declare attempts: CreationOptional<number>;
  declare maxAttempts: CreationOptional<number>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare lastAttemptAt: CreationOptional<Date | null>;
  declare lastError: CreationOptional<string | null>;
  /** End of a sender's claim while it sends the message; null when no sender holds it. */
  declare claimedUntil: CreationOptional<Date | null>;
  declare smtpResponse: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare sentAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize): void {
    MailMessage.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        kind: { type: DataTypes.TEXT, allowNull: false },
        plateId: { type: DataTypes.UUID, allowNull: true },
        signoffEventId: { type: DataTypes.UUID, allowNull: true },
        recipientId: { type: DataTypes.UUID, allowNull: false },
        toAddress: { type: DataTypes.TEXT, allowNull: false },
        subject: { type: DataTypes.TEXT, allowNull: false },
        bodyText: { type: DataTypes.TEXT, allowNull: false },
        state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        maxAttempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 8 },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        lastAttemptAt: { type: DataTypes.DATE, allowNull: true },
        lastError: { type: DataTypes.TEXT, allowNull: true },
        claimedUntil: { type: DataTypes.DATE, allowNull: true },
        smtpResponse: { type: DataTypes.TEXT, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        sentAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, tableName: 'mail_outbox', underscored: true, timestamps: false },
    );
  }
}
