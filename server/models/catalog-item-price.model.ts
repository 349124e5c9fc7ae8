import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import { decimalNumber } from "./catalog-item.model";

/** The prices of a catalog item as of a version: what a quote made at that version used. */
export class CatalogItemPrice extends Model<InferAttributes<CatalogItemPrice>, InferCreationAttributes<CatalogItemPrice>> {
  declare id: CreationOptional<number>;
  declare itemId: number;
  declare version: number;
  declare unitCostCents: number;
  declare packCoverage: number;
  declare wastePct: number | null;
  declare changedBy: number | null;
  declare createdAt: CreationOptional<Date>;
}

export const initCatalogItemPrice = (sequelize: Sequelize) =>
  CatalogItemPrice.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      itemId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      unitCostCents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      packCoverage: decimalNumber("packCoverage", false, 14, 4),
      wastePct: decimalNumber("wastePct", true, 5, 2),
      changedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: "catalog_item_prices", underscored: true, updatedAt: false },
  );
