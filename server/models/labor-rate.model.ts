import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import { LABOR_KINDS, type LaborKind } from "../../shared/schemas/price-book";
import { decimalNumber } from "./catalog-item.model";

export class LaborRate extends Model<InferAttributes<LaborRate>, InferCreationAttributes<LaborRate>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare kind: LaborKind;
  declare label: string;
  declare minPitch: number | null;
  declare maxPitch: number | null;
  declare centsPerUnit: number;
  declare unit: string;
  declare sortOrder: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const initLaborRate = (sequelize: Sequelize) =>
  LaborRate.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      kind: { type: DataTypes.ENUM(...LABOR_KINDS), allowNull: false },
      label: { type: DataTypes.STRING(120), allowNull: false },
      minPitch: decimalNumber("minPitch", true, 5, 2),
      maxPitch: decimalNumber("maxPitch", true, 5, 2),
      centsPerUnit: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      unit: { type: DataTypes.STRING(20), allowNull: false },
      sortOrder: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "labor_rates", underscored: true },
  );
