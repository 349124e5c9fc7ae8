import { DataTypes, type QueryInterface } from "sequelize";

/**
 * A revision of a quote: what it was priced from (roof, site, price book, frozen as JSON), its inputs
 * (manual lines, overrides, discount), its state and the people and times of submit, approve and return.
 * Once it leaves draft it never changes again.
 */
export async function up(qi: QueryInterface) {
  const user = (onDelete = "SET NULL") => ({
    type: DataTypes.INTEGER.UNSIGNED,
    allowNull: true,
    references: { model: "users", key: "id" },
    onDelete,
  });
  await qi.createTable("quote_revisions", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    quote_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "quotes", key: "id" },
      onDelete: "CASCADE",
    },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "RESTRICT",
    },
    revision_no: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    status: {
      type: DataTypes.ENUM("draft", "in_review", "approved", "sent", "accepted", "declined", "expired"),
      allowNull: false,
      defaultValue: "draft",
    },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    notes: { type: DataTypes.TEXT, allowNull: true },
    roof_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    roof_snapshot: { type: DataTypes.JSON, allowNull: false },
    site_snapshot: { type: DataTypes.JSON, allowNull: false },
    price_book_snapshot: { type: DataTypes.JSON, allowNull: false },
    inputs: { type: DataTypes.JSON, allowNull: false },
    total_cents: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    margin_pct: { type: DataTypes.DECIMAL(7, 3), allowNull: false, defaultValue: 0 },
    min_margin_pct: { type: DataTypes.DECIMAL(6, 2), allowNull: false, defaultValue: 0 },
    submitted_at: { type: DataTypes.DATE, allowNull: true },
    submitted_by: user(),
    approved_at: { type: DataTypes.DATE, allowNull: true },
    approved_by: user(),
    approval_reason: { type: DataTypes.TEXT, allowNull: true },
    returned_at: { type: DataTypes.DATE, allowNull: true },
    returned_by: user(),
    return_comment: { type: DataTypes.TEXT, allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    decided_at: { type: DataTypes.DATE, allowNull: true },
    created_by: user(),
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("quote_revisions", ["quote_id", "revision_no"], { name: "quote_revisions_quote_no", unique: true });
  // The approvals queue: a company's revisions in review, oldest submitted first.
  await qi.addIndex("quote_revisions", ["company_id", "status", "submitted_at"], { name: "quote_revisions_queue" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("quote_revisions");
}
