import { DataTypes, type QueryInterface } from "sequelize";
import { CATALOG_CATEGORIES, UNITS } from "../../../shared/schemas/price-book";

export async function up(qi: QueryInterface) {
  await qi.createTable("catalog_items", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "CASCADE",
    },
    sku: { type: DataTypes.STRING(40), allowNull: false },
    category: { type: DataTypes.ENUM(...CATALOG_CATEGORIES), allowNull: false },
    name: { type: DataTypes.STRING(200), allowNull: false },
    purchase_unit: { type: DataTypes.ENUM(...UNITS), allowNull: false },
    /** Coverage units per purchase unit (ft² per roll, LF per piece, pieces per box). */
    pack_coverage: { type: DataTypes.DECIMAL(14, 4), allowNull: false },
    coverage_unit: { type: DataTypes.ENUM(...UNITS), allowNull: false },
    unit_cost_cents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    waste_pct: { type: DataTypes.DECIMAL(5, 2), allowNull: true },
    material_key: { type: DataTypes.STRING(40), allowNull: true },
    attributes: { type: DataTypes.JSON, allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("catalog_items", ["company_id", "sku"], { unique: true, name: "catalog_items_company_sku" });
  await qi.addIndex("catalog_items", ["company_id", "active", "category"], { name: "catalog_items_company_active" });
  // One active item per material key and company: the key is copied into a generated column only while
  // the item is active, and NULLs do not collide in a unique index.
  await qi.sequelize.query(
    "ALTER TABLE catalog_items ADD COLUMN active_material_key VARCHAR(40) AS (IF(active, material_key, NULL)) PERSISTENT",
  );
  await qi.addIndex("catalog_items", ["company_id", "active_material_key"], {
    unique: true,
    name: "catalog_items_company_active_key",
  });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("catalog_items");
}
