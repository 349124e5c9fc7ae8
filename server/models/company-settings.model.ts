import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import { PRICING_MODES, TAX_BASES } from "../../shared/schemas/price-book";
import { decimalNumber } from "./catalog-item.model";

/** A company's pricing settings (one row per company, created with the defaults on first use). */
export class CompanySettings extends Model<InferAttributes<CompanySettings>, InferCreationAttributes<CompanySettings>> {
  declare companyId: number;
  declare pricingMode: (typeof PRICING_MODES)[number];
  declare markupPct: number;
  declare targetMarginPct: number;
  declare minMarginPct: number;
  declare taxRatePct: number;
  declare taxBasis: (typeof TAX_BASES)[number];
  declare depositPct: number;
  declare proposalValidityDays: number;
  /** Adds 1 on every change to the company's items, labour rates or settings. */
  declare priceBookVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const initCompanySettings = (sequelize: Sequelize) =>
  CompanySettings.init(
    {
      companyId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
      pricingMode: { type: DataTypes.ENUM(...PRICING_MODES), allowNull: false },
      markupPct: decimalNumber("markupPct", false, 6, 2),
      targetMarginPct: decimalNumber("targetMarginPct", false, 5, 2),
      minMarginPct: decimalNumber("minMarginPct", false, 5, 2),
      taxRatePct: decimalNumber("taxRatePct", false, 6, 3),
      taxBasis: { type: DataTypes.ENUM(...TAX_BASES), allowNull: false },
      depositPct: decimalNumber("depositPct", false, 5, 2),
      proposalValidityDays: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      priceBookVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "company_settings", underscored: true },
  );
