/**
 * Quotes: a quote of a job has revisions; a revision has options; an option has priced lines. Owners'
 * decisions on revisions in review are kept in approvals. Money in integer cents (BIGINT columns come
 * back from MariaDB as strings or numbers: read them with Number()).
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import { APPROVAL_DECISIONS, QUOTE_LINE_KINDS, QUOTE_STATUSES, type ApprovalDecision, type QuoteLineKind, type QuoteStatus } from "../../shared/schemas/quote";
import type { User } from "./user.model";

type Num = string | number;

export class Quote extends Model<InferAttributes<Quote>, InferCreationAttributes<Quote>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare jobId: number;
  declare number: string;
  declare status: CreationOptional<QuoteStatus>;
  declare currentRevisionId: number | null;
  declare archivedAt: CreationOptional<Date | null>;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class QuoteRevision extends Model<InferAttributes<QuoteRevision>, InferCreationAttributes<QuoteRevision>> {
  declare id: CreationOptional<number>;
  declare quoteId: number;
  declare companyId: number;
  declare revisionNo: number;
  declare status: CreationOptional<QuoteStatus>;
  declare version: CreationOptional<number>;
  declare notes: string | null;
  declare roofVersion: number;
  declare roofSnapshot: unknown;
  declare siteSnapshot: unknown;
  declare priceBookSnapshot: unknown;
  declare inputs: unknown;
  declare totalCents: CreationOptional<Num>;
  declare marginPct: CreationOptional<Num>;
  declare minMarginPct: CreationOptional<Num>;
  declare submittedAt: CreationOptional<Date | null>;
  declare submittedBy: CreationOptional<number | null>;
  declare approvedAt: CreationOptional<Date | null>;
  declare approvedBy: CreationOptional<number | null>;
  declare approvalReason: CreationOptional<string | null>;
  declare returnedAt: CreationOptional<Date | null>;
  declare returnedBy: CreationOptional<number | null>;
  declare returnComment: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare options?: NonAttribute<QuoteOption[]>;
  declare creator?: NonAttribute<User | null>;
  declare submitter?: NonAttribute<User | null>;
  declare approver?: NonAttribute<User | null>;
  declare returner?: NonAttribute<User | null>;
}

export class QuoteOption extends Model<InferAttributes<QuoteOption>, InferCreationAttributes<QuoteOption>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare position: number;
  declare label: string;
  declare spec: unknown;
  declare takeoff: unknown;
  declare costCents: Num;
  declare priceCents: Num;
  declare taxCents: Num;
  declare totalCents: Num;
  declare marginPct: Num;
  declare depositCents: Num;
  declare belowMinMargin: boolean;
  declare hasOverrides: boolean;
  declare missingItems: unknown;
  declare unmatchedOverrides: unknown;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare lines?: NonAttribute<QuoteLine[]>;
}

export class QuoteLine extends Model<InferAttributes<QuoteLine>, InferCreationAttributes<QuoteLine>> {
  declare id: CreationOptional<number>;
  declare optionId: number;
  declare position: number;
  declare kind: QuoteLineKind;
  declare key: string | null;
  declare description: string;
  declare quantity: Num;
  declare unit: string;
  declare unitCostCents: Num;
  declare costCents: Num;
  declare priceCents: Num;
  declare taxable: boolean;
  declare overrideReason: string | null;
}

export class Approval extends Model<InferAttributes<Approval>, InferCreationAttributes<Approval>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare companyId: number;
  declare ownerId: number | null;
  declare decision: ApprovalDecision;
  declare reasonOrComment: string | null;
  declare marginPct: Num;
  declare createdAt: CreationOptional<Date>;
}

const id = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
const fk = (allowNull = false) => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull });
/** A fresh definition each time: Sequelize writes the column name into the object it is given. */
const money = () => ({ type: DataTypes.BIGINT, allowNull: false });

export function initQuoteModels(sequelize: Sequelize): void {
  Quote.init(
    {
      id: id(),
      companyId: fk(),
      jobId: fk(),
      number: { type: DataTypes.STRING(40), allowNull: false },
      status: { type: DataTypes.ENUM(...QUOTE_STATUSES), allowNull: false, defaultValue: "draft" },
      currentRevisionId: fk(true),
      archivedAt: { type: DataTypes.DATE, allowNull: true },
      createdBy: fk(true),
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "quotes", underscored: true },
  );
  QuoteRevision.init(
    {
      id: id(),
      quoteId: fk(),
      companyId: fk(),
      revisionNo: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      status: { type: DataTypes.ENUM(...QUOTE_STATUSES), allowNull: false, defaultValue: "draft" },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      notes: { type: DataTypes.TEXT, allowNull: true },
      roofVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      roofSnapshot: { type: DataTypes.JSON, allowNull: false },
      siteSnapshot: { type: DataTypes.JSON, allowNull: false },
      priceBookSnapshot: { type: DataTypes.JSON, allowNull: false },
      inputs: { type: DataTypes.JSON, allowNull: false },
      totalCents: { ...money(), defaultValue: 0 },
      marginPct: { type: DataTypes.DECIMAL(7, 3), allowNull: false, defaultValue: 0 },
      minMarginPct: { type: DataTypes.DECIMAL(6, 2), allowNull: false, defaultValue: 0 },
      submittedAt: { type: DataTypes.DATE, allowNull: true },
      submittedBy: fk(true),
      approvedAt: { type: DataTypes.DATE, allowNull: true },
      approvedBy: fk(true),
      approvalReason: { type: DataTypes.TEXT, allowNull: true },
      returnedAt: { type: DataTypes.DATE, allowNull: true },
      returnedBy: fk(true),
      returnComment: { type: DataTypes.TEXT, allowNull: true },
      sentAt: { type: DataTypes.DATE, allowNull: true },
      decidedAt: { type: DataTypes.DATE, allowNull: true },
      createdBy: fk(true),
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "quote_revisions", underscored: true },
  );
  QuoteOption.init(
    {
      id: id(),
      revisionId: fk(),
      position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      label: { type: DataTypes.STRING(80), allowNull: false },
      spec: { type: DataTypes.JSON, allowNull: false },
      takeoff: { type: DataTypes.JSON, allowNull: false },
      costCents: money(),
      priceCents: money(),
      taxCents: money(),
      totalCents: money(),
      marginPct: { type: DataTypes.DECIMAL(7, 3), allowNull: false },
      depositCents: money(),
      belowMinMargin: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      hasOverrides: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      missingItems: { type: DataTypes.JSON, allowNull: false },
      unmatchedOverrides: { type: DataTypes.JSON, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "quote_options", underscored: true },
  );
  QuoteLine.init(
    {
      id: id(),
      optionId: fk(),
      position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      kind: { type: DataTypes.ENUM(...QUOTE_LINE_KINDS), allowNull: false },
      key: { type: DataTypes.STRING(80), allowNull: true },
      description: { type: DataTypes.STRING(255), allowNull: false },
      quantity: { type: DataTypes.DECIMAL(14, 4), allowNull: false },
      unit: { type: DataTypes.STRING(20), allowNull: false },
      unitCostCents: money(),
      costCents: money(),
      priceCents: money(),
      taxable: { type: DataTypes.BOOLEAN, allowNull: false },
      overrideReason: { type: DataTypes.STRING(500), allowNull: true },
    },
    { sequelize, tableName: "quote_lines", underscored: true, timestamps: false },
  );
  Approval.init(
    {
      id: id(),
      revisionId: fk(),
      companyId: fk(),
      ownerId: fk(true),
      decision: { type: DataTypes.ENUM(...APPROVAL_DECISIONS), allowNull: false },
      reasonOrComment: { type: DataTypes.TEXT, allowNull: true },
      marginPct: { type: DataTypes.DECIMAL(7, 3), allowNull: false },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: "approvals", underscored: true, updatedAt: false },
  );
}
