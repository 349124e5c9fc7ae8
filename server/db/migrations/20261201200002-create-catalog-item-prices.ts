import { DataTypes, type QueryInterface } from "sequelize";

/** Price history of catalog items: one row per version that changed a price field (and the first version). */
export async function up(qi: QueryInterface) {
  await qi.createTable("catalog_item_prices", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    item_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "catalog_items", key: "id" },
      onDelete: "CASCADE",
    },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    unit_cost_cents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    pack_coverage: { type: DataTypes.DECIMAL(14, 4), allowNull: false },
    waste_pct: { type: DataTypes.DECIMAL(5, 2), allowNull: true },
    changed_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("catalog_item_prices", ["item_id", "version"], { unique: true, name: "catalog_item_prices_item_version" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("catalog_item_prices");
}
