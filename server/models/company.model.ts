import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export class Company extends Model<InferAttributes<Company>, InferCreationAttributes<Company>> {
  declare id: CreationOptional<number>;
  declare name: string;
  // The profile printed on proposals and e-mails (owner edits through PUT /api/company).
  declare legalName: CreationOptional<string | null>;
  declare logoAttachmentKey: CreationOptional<string | null>;
  declare licenceNumber: CreationOptional<string | null>;
  declare addressLine1: CreationOptional<string | null>;
  declare addressLine2: CreationOptional<string | null>;
  declare city: CreationOptional<string | null>;
  declare region: CreationOptional<string | null>;
  declare postalCode: CreationOptional<string | null>;
  declare phone: CreationOptional<string | null>;
  declare email: CreationOptional<string | null>;
  declare website: CreationOptional<string | null>;
  declare proposalTerms: CreationOptional<string | null>;
  declare exclusions: CreationOptional<string | null>;
  declare warranty: CreationOptional<string | null>;
  declare proposalPrefix: CreationOptional<string>;
  declare nextProposalNumber: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const text = (len: number) => ({ type: DataTypes.STRING(len), allowNull: true });

export const initCompany = (sequelize: Sequelize) =>
  Company.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(160), allowNull: false },
      legalName: text(200),
      logoAttachmentKey: text(200),
      licenceNumber: text(60),
      addressLine1: text(160),
      addressLine2: text(160),
      city: text(80),
      region: text(80),
      postalCode: text(20),
      phone: text(40),
      email: text(254),
      website: text(200),
      proposalTerms: { type: DataTypes.TEXT, allowNull: true },
      exclusions: { type: DataTypes.TEXT, allowNull: true },
      warranty: { type: DataTypes.TEXT, allowNull: true },
      proposalPrefix: { type: DataTypes.STRING(12), allowNull: false, defaultValue: "" },
      nextProposalNumber: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "companies", underscored: true },
  );
