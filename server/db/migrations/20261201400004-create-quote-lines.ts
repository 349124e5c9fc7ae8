import { DataTypes, type QueryInterface } from "sequelize";

/** The priced lines of an option (computed by shared/pricing; manual, discount and overridden lines too). */
export async function up(qi: QueryInterface) {
  await qi.createTable("quote_lines", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    option_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "quote_options", key: "id" },
      onDelete: "CASCADE",
    },
    position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    kind: { type: DataTypes.ENUM("material", "labor", "tearoff", "deck", "manual", "discount"), allowNull: false },
    key: { type: DataTypes.STRING(80), allowNull: true },
    description: { type: DataTypes.STRING(255), allowNull: false },
    quantity: { type: DataTypes.DECIMAL(14, 4), allowNull: false },
    unit: { type: DataTypes.STRING(20), allowNull: false },
    unit_cost_cents: { type: DataTypes.BIGINT, allowNull: false },
    cost_cents: { type: DataTypes.BIGINT, allowNull: false },
    price_cents: { type: DataTypes.BIGINT, allowNull: false },
    taxable: { type: DataTypes.BOOLEAN, allowNull: false },
    override_reason: { type: DataTypes.STRING(500), allowNull: true },
  });
  await qi.addIndex("quote_lines", ["option_id", "position"], { name: "quote_lines_option" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("quote_lines");
}
