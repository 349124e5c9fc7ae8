import { DataTypes, type QueryInterface } from "sequelize";

/** E-mails waiting to be sent (or sent): written in the same transaction as the change that causes them. */
export async function up(qi: QueryInterface) {
  await qi.createTable("outbox_messages", {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "companies", key: "id" },
      onDelete: "SET NULL",
    },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    from_address: { type: DataTypes.STRING(320), allowNull: true },
    to_addresses: { type: DataTypes.JSON, allowNull: false },
    cc: { type: DataTypes.JSON, allowNull: true },
    bcc: { type: DataTypes.JSON, allowNull: true },
    subject: { type: DataTypes.STRING(500), allowNull: false },
    text: { type: "LONGTEXT", allowNull: false },
    html: { type: "LONGTEXT", allowNull: false },
    headers: { type: DataTypes.JSON, allowNull: true },
    attachments: { type: DataTypes.JSON, allowNull: true },
    status: { type: DataTypes.ENUM("pending", "sending", "sent", "failed"), allowNull: false, defaultValue: "pending" },
    attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    next_attempt_at: { type: DataTypes.DATE(3), allowNull: false },
    last_error: { type: DataTypes.TEXT, allowNull: true },
    sent_at: { type: DataTypes.DATE(3), allowNull: true },
    message_id: { type: DataTypes.STRING(255), allowNull: true },
    claimed_by: { type: DataTypes.STRING(100), allowNull: true },
    claimed_at: { type: DataTypes.DATE(3), allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex("outbox_messages", ["status", "next_attempt_at"], { name: "outbox_messages_status_due" });
  await qi.addIndex("outbox_messages", ["company_id", "kind", "created_at"], { name: "outbox_messages_company_kind" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("outbox_messages");
}
