import { DataTypes, type QueryInterface } from "sequelize";

/** A quote of a job: its number, its status (the current revision's) and which revision is current. */
export async function up(qi: QueryInterface) {
  await qi.createTable("quotes", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "RESTRICT",
    },
    job_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "jobs", key: "id" },
      onDelete: "RESTRICT",
    },
    number: { type: DataTypes.STRING(40), allowNull: false },
    status: {
      type: DataTypes.ENUM("draft", "in_review", "approved", "sent", "accepted", "declined", "expired"),
      allowNull: false,
      defaultValue: "draft",
    },
    // Points at quote_revisions (created in the next migration); kept without a constraint so a quote and
    // its first revision can be written in either order.
    current_revision_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    archived_at: { type: DataTypes.DATE, allowNull: true },
    created_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("quotes", ["company_id", "number"], { name: "quotes_company_number", unique: true });
  await qi.addIndex("quotes", ["company_id", "job_id", "archived_at"], { name: "quotes_company_job" });
  await qi.addIndex("quotes", ["job_id", "created_at"], { name: "quotes_job_created" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("quotes");
}
