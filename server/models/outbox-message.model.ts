import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export const OUTBOX_STATUSES = ["pending", "sending", "sent", "failed"] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];

/** An attachment as stored in the outbox: the bytes in base64 (a proposal PDF is well under 1 MB). */
export interface StoredAttachment {
  filename: string;
  contentType: string;
  contentBase64: string;
}

export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>;
  declare companyId: number | null;
  declare kind: string;
  declare fromAddress: string | null;
  declare toAddresses: string[];
  declare cc: string[] | null;
  declare bcc: string[] | null;
  declare subject: string;
  declare text: string;
  declare html: string;
  declare headers: Record<string, string> | null;
  declare attachments: StoredAttachment[] | null;
  declare status: CreationOptional<OutboxStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare lastError: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare messageId: CreationOptional<string | null>;
  declare claimedBy: CreationOptional<string | null>;
  declare claimedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const initOutboxMessage = (sequelize: Sequelize) =>
  OutboxMessage.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      kind: { type: DataTypes.STRING(40), allowNull: false },
      fromAddress: { type: DataTypes.STRING(320), allowNull: true },
      toAddresses: { type: DataTypes.JSON, allowNull: false },
      cc: { type: DataTypes.JSON, allowNull: true },
      bcc: { type: DataTypes.JSON, allowNull: true },
      subject: { type: DataTypes.STRING(500), allowNull: false },
      text: { type: DataTypes.TEXT("long"), allowNull: false },
      html: { type: DataTypes.TEXT("long"), allowNull: false },
      headers: { type: DataTypes.JSON, allowNull: true },
      attachments: { type: DataTypes.JSON, allowNull: true },
      status: { type: DataTypes.ENUM(...OUTBOX_STATUSES), allowNull: false, defaultValue: "pending" },
      attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      nextAttemptAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      lastError: { type: DataTypes.TEXT, allowNull: true },
      sentAt: { type: DataTypes.DATE(3), allowNull: true },
      messageId: { type: DataTypes.STRING(255), allowNull: true },
      claimedBy: { type: DataTypes.STRING(100), allowNull: true },
      claimedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "outbox_messages", underscored: true },
  );
