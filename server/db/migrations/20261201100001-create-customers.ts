import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("customers", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "RESTRICT",
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: true },
    phone: { type: DataTypes.STRING(40), allowNull: true },
    address_line1: { type: DataTypes.STRING(160), allowNull: true },
    address_line2: { type: DataTypes.STRING(160), allowNull: true },
    city: { type: DataTypes.STRING(80), allowNull: true },
    region: { type: DataTypes.STRING(80), allowNull: true },
    postal_code: { type: DataTypes.STRING(20), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    archived_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("customers", ["company_id", "archived_at", "name"], { name: "customers_company_archived_name" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("customers");
}
