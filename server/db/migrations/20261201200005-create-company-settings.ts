import { DataTypes, type QueryInterface } from "sequelize";
import { PRICING_MODES, TAX_BASES } from "../../../shared/schemas/price-book";

/** Pricing settings, one row per company; price_book_version adds 1 on every price-book change. */
export async function up(qi: QueryInterface) {
  await qi.createTable("company_settings", {
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      primaryKey: true,
      references: { model: "companies", key: "id" },
      onDelete: "CASCADE",
    },
    pricing_mode: { type: DataTypes.ENUM(...PRICING_MODES), allowNull: false },
    markup_pct: { type: DataTypes.DECIMAL(6, 2), allowNull: false },
    target_margin_pct: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
    min_margin_pct: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
    tax_rate_pct: { type: DataTypes.DECIMAL(6, 3), allowNull: false },
    tax_basis: { type: DataTypes.ENUM(...TAX_BASES), allowNull: false },
    deposit_pct: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
    proposal_validity_days: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    price_book_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("company_settings");
}
