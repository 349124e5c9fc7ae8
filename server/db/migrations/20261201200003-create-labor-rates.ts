import { DataTypes, type QueryInterface } from "sequelize";
import { LABOR_KINDS } from "../../../shared/schemas/price-book";

export async function up(qi: QueryInterface) {
  await qi.createTable("labor_rates", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "CASCADE",
    },
    kind: { type: DataTypes.ENUM(...LABOR_KINDS), allowNull: false },
    label: { type: DataTypes.STRING(120), allowNull: false },
    min_pitch: { type: DataTypes.DECIMAL(5, 2), allowNull: true },
    max_pitch: { type: DataTypes.DECIMAL(5, 2), allowNull: true },
    cents_per_unit: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    unit: { type: DataTypes.STRING(20), allowNull: false },
    sort_order: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("labor_rates", ["company_id", "sort_order"], { name: "labor_rates_company" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("labor_rates");
}
