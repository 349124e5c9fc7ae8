import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export class Customer extends Model<InferAttributes<Customer>, InferCreationAttributes<Customer>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare name: string;
  declare email: string | null;
  declare phone: string | null;
  declare addressLine1: string | null;
  declare addressLine2: string | null;
  declare city: string | null;
  declare region: string | null;
  declare postalCode: string | null;
  declare notes: string | null;
  declare archivedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const initCustomer = (sequelize: Sequelize) =>
  Customer.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      email: { type: DataTypes.STRING(254), allowNull: true },
      phone: { type: DataTypes.STRING(40), allowNull: true },
      addressLine1: { type: DataTypes.STRING(160), allowNull: true },
      addressLine2: { type: DataTypes.STRING(160), allowNull: true },
      city: { type: DataTypes.STRING(80), allowNull: true },
      region: { type: DataTypes.STRING(80), allowNull: true },
      postalCode: { type: DataTypes.STRING(20), allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      archivedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "customers", underscored: true },
  );
