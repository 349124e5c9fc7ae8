import { DataTypes, type QueryInterface } from "sequelize";

/** The options of a revision (e.g. two or three spacer choices), each with its frozen takeoff and totals. */
export async function up(qi: QueryInterface) {
  await qi.createTable("quote_options", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    revision_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "quote_revisions", key: "id" },
      onDelete: "CASCADE",
    },
    position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    label: { type: DataTypes.STRING(80), allowNull: false },
    spec: { type: DataTypes.JSON, allowNull: false },
    takeoff: { type: DataTypes.JSON, allowNull: false },
    cost_cents: { type: DataTypes.BIGINT, allowNull: false },
    price_cents: { type: DataTypes.BIGINT, allowNull: false },
    tax_cents: { type: DataTypes.BIGINT, allowNull: false },
    total_cents: { type: DataTypes.BIGINT, allowNull: false },
    margin_pct: { type: DataTypes.DECIMAL(7, 3), allowNull: false },
    deposit_cents: { type: DataTypes.BIGINT, allowNull: false },
    below_min_margin: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    has_overrides: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    missing_items: { type: DataTypes.JSON, allowNull: false },
    unmatched_overrides: { type: DataTypes.JSON, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("quote_options", ["revision_id", "position"], { name: "quote_options_revision" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("quote_options");
}
