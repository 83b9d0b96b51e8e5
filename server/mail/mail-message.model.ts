import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Where a message stands with the SMTP server. */
export type MailStatus = 'sending' | 'sent' | 'failed';

/** The system's copy of one e-mail it sent (or tried to send), listed in `Outbox`. */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: string;
  declare organizationId: string | null;
  declare recipients: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string | null;
  declare attachments: string;
  declare status: MailStatus;
  declare errorMessage: string | null;
  declare transportMessageId: string | null;
  declare createdAt?: Date;
  declare updatedAt?: Date;
}

export function initMailMessageModel(sequelize: Sequelize): void {
  MailMessage.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: true },
      recipients: { type: DataTypes.TEXT, allowNull: false },
      subject: { type: DataTypes.STRING(300), allowNull: false },
      textBody: { type: DataTypes.TEXT, allowNull: false },
      htmlBody: { type: DataTypes.TEXT, allowNull: true },
      attachments: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.STRING(16), allowNull: false },
      errorMessage: { type: DataTypes.STRING(500), allowNull: true },
      transportMessageId: { type: DataTypes.STRING(300), allowNull: true },
    },
    { sequelize, tableName: 'mail_messages' },
  );
}
