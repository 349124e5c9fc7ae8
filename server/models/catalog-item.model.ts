import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import {
  CATALOG_CATEGORIES,
  UNITS,
  type CatalogCategory,
  type CatalogItemAttributes,
  type Unit,
} from "../../shared/schemas/price-book";

/** DECIMAL columns come back from MariaDB as strings; the model hands out numbers. */
export const decimalNumber = (column: string, allowNull: boolean, precision: number, scale: number) => ({
  type: DataTypes.DECIMAL(precision, scale),
  allowNull,
  get(this: Model) {
    const v = this.getDataValue(column as never) as unknown;
    return v === null || v === undefined ? v : Number(v);
  },
});

/** A price-book item. `version` adds 1 on every accepted change; price changes also write a catalog_item_prices row. */
export class CatalogItem extends Model<InferAttributes<CatalogItem>, InferCreationAttributes<CatalogItem>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare sku: string;
  declare category: CatalogCategory;
  declare name: string;
  declare purchaseUnit: Unit;
  declare packCoverage: number;
  declare coverageUnit: Unit;
  declare unitCostCents: number;
  declare wastePct: number | null;
  declare materialKey: string | null;
  declare attributes: CatalogItemAttributes;
  declare active: CreationOptional<boolean>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const initCatalogItem = (sequelize: Sequelize) =>
  CatalogItem.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      sku: { type: DataTypes.STRING(40), allowNull: false },
      category: { type: DataTypes.ENUM(...CATALOG_CATEGORIES), allowNull: false },
      name: { type: DataTypes.STRING(200), allowNull: false },
      purchaseUnit: { type: DataTypes.ENUM(...UNITS), allowNull: false },
      packCoverage: decimalNumber("packCoverage", false, 14, 4),
      coverageUnit: { type: DataTypes.ENUM(...UNITS), allowNull: false },
      unitCostCents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      wastePct: decimalNumber("wastePct", true, 5, 2),
      materialKey: { type: DataTypes.STRING(40), allowNull: true },
      attributes: {
        type: DataTypes.JSON,
        allowNull: false,
        // The mariadb driver may hand JSON back as text.
        get(this: CatalogItem) {
          const v = this.getDataValue("attributes") as unknown;
          return (typeof v === "string" ? JSON.parse(v) : (v ?? {})) as CatalogItemAttributes;
        },
      },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "catalog_items", underscored: true },
  );
