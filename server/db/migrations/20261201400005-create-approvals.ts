import { DataTypes, type QueryInterface } from "sequelize";

/** Each owner decision on a revision in review: approved (with the reason when one was needed) or returned. */
export async function up(qi: QueryInterface) {
  await qi.createTable("approvals", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    revision_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "quote_revisions", key: "id" },
      onDelete: "CASCADE",
    },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "RESTRICT",
    },
    owner_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    decision: { type: DataTypes.ENUM("approved", "returned"), allowNull: false },
    reason_or_comment: { type: DataTypes.TEXT, allowNull: true },
    margin_pct: { type: DataTypes.DECIMAL(7, 3), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("approvals", ["revision_id", "created_at"], { name: "approvals_revision" });
  await qi.addIndex("approvals", ["company_id", "created_at"], { name: "approvals_company" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("approvals");
}
