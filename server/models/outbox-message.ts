import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>;
  declare organizationId: number | null;
  declare messageId: string | null;
  declare fromAddress: string;
  declare toAddresses: string[];
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string | null;
  declare headers: Record<string, string>;
  declare receivedAt: Date;

  static initModel(sequelize: Sequelize): void {
    OutboxMessage.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: true },
        messageId: { type: DataTypes.STRING(300), allowNull: true },
        fromAddress: { type: DataTypes.STRING(300), allowNull: false },
        toAddresses: { type: DataTypes.JSONB, allowNull: false },
        subject: { type: DataTypes.STRING(500), allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: false },
        htmlBody: { type: DataTypes.TEXT, allowNull: true },
        headers: { type: DataTypes.JSONB, allowNull: false },
        receivedAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'outbox_messages', underscored: true, timestamps: false },
    );
  }
}

export class OutboxAttachment extends Model<InferAttributes<OutboxAttachment>, InferCreationAttributes<OutboxAttachment>> {
  declare id: CreationOptional<number>;
  declare messageId: number;
  declare filename: string;
  declare contentType: string;
  declare sizeBytes: number;
  declare content: Buffer;

  static initModel(sequelize: Sequelize): void {
    OutboxAttachment.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        messageId: { type: DataTypes.INTEGER, allowNull: false },
        filename: { type: DataTypes.STRING(255), allowNull: false },
        contentType: { type: DataTypes.STRING(120), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        content: { type: DataTypes.BLOB, allowNull: false },
      },
      { sequelize, tableName: 'outbox_attachments', underscored: true, timestamps: false },
    );
  }
}
