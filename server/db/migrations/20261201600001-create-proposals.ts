import { DataTypes, type QueryInterface } from "sequelize";

const fk = (model: string, allowNull = false, onDelete = "RESTRICT") => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model, key: "id" },
  onDelete,
});

/** A proposal sent to a homeowner: one link (only the SHA-256 of its token is kept) per send. */
export async function up(qi: QueryInterface) {
  await qi.createTable("proposals", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: fk("companies"),
    quote_id: fk("quotes"),
    revision_id: fk("quote_revisions"),
    job_id: fk("jobs"),
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    status: { type: DataTypes.ENUM("active", "revoked", "accepted", "declined", "expired"), allowNull: false, defaultValue: "active" },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    sent_to: { type: DataTypes.STRING(320), allowNull: false },
    sent_by: fk("users", true, "SET NULL"),
    pdf_key: { type: DataTypes.STRING(80), allowNull: true },
    pdf_sha256: { type: DataTypes.CHAR(64), allowNull: true },
    viewed_at: { type: DataTypes.DATE, allowNull: true },
    last_viewed_at: { type: DataTypes.DATE, allowNull: true },
    accepted_at: { type: DataTypes.DATE, allowNull: true },
    accepted_option_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    signer_name: { type: DataTypes.STRING(200), allowNull: true },
    signer_ip: { type: DataTypes.STRING(64), allowNull: true },
    signer_user_agent: { type: DataTypes.STRING(500), allowNull: true },
    signed_pdf_key: { type: DataTypes.STRING(80), allowNull: true },
    signed_pdf_sha256: { type: DataTypes.CHAR(64), allowNull: true },
    declined_at: { type: DataTypes.DATE, allowNull: true },
    decline_reason: { type: DataTypes.TEXT, allowNull: true },
    reminder_sent_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("proposals", ["company_id", "job_id", "created_at"], { name: "proposals_job" });
  await qi.addIndex("proposals", ["quote_id", "status"], { name: "proposals_quote_status" });
  await qi.addIndex("proposals", ["status", "expires_at"], { name: "proposals_due" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("proposals");
}
