import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("jobs", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "RESTRICT",
    },
    customer_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "customers", key: "id" },
      onDelete: "RESTRICT",
    },
    site_address_line1: { type: DataTypes.STRING(160), allowNull: true },
    site_address_line2: { type: DataTypes.STRING(160), allowNull: true },
    site_city: { type: DataTypes.STRING(80), allowNull: true },
    site_region: { type: DataTypes.STRING(80), allowNull: true },
    site_postal_code: { type: DataTypes.STRING(20), allowNull: true },
    status: {
      type: DataTypes.ENUM("lead", "estimating", "proposed", "won", "scheduled", "installed", "lost"),
      allowNull: false,
      defaultValue: "lead",
    },
    estimator_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    site: { type: DataTypes.JSON, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    squares: { type: DataTypes.DECIMAL(10, 2), allowNull: true },
    quote_total_cents: { type: DataTypes.BIGINT, allowNull: true },
    archived_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  // The jobs board: company + archived + status filter, newest change first.
  await qi.addIndex("jobs", ["company_id", "archived_at", "status", "updated_at"], { name: "jobs_board_status" });
  // The board without a status filter, sorted by last change.
  await qi.addIndex("jobs", ["company_id", "archived_at", "updated_at"], { name: "jobs_board_updated" });
  await qi.addIndex("jobs", ["company_id", "estimator_id"], { name: "jobs_company_estimator" });
  await qi.addIndex("jobs", ["company_id", "customer_id"], { name: "jobs_company_customer" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("jobs");
}
