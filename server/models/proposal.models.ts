/**
 * Proposals sent to homeowners (one per send; only the SHA-256 of the link's token is stored), their deposit
 * payments, the provider's webhook events (once per event id) and the kept PDF of each approved revision.
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export const PROPOSAL_ROW_STATUSES = ["active", "revoked", "accepted", "declined", "expired"] as const;
export type ProposalRowStatus = (typeof PROPOSAL_ROW_STATUSES)[number];
export const PAYMENT_STATUSES = ["pending", "paid", "failed", "expired"] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

type Num = string | number;

export class Proposal extends Model<InferAttributes<Proposal>, InferCreationAttributes<Proposal>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare quoteId: number;
  declare revisionId: number;
  declare jobId: number;
  declare tokenHash: string;
  declare status: CreationOptional<ProposalRowStatus>;
  declare expiresAt: Date;
  declare sentTo: string;
  declare sentBy: number | null;
  declare pdfKey: CreationOptional<string | null>;
  declare pdfSha256: CreationOptional<string | null>;
  declare viewedAt: CreationOptional<Date | null>;
  declare lastViewedAt: CreationOptional<Date | null>;
  declare acceptedAt: CreationOptional<Date | null>;
  declare acceptedOptionId: CreationOptional<number | null>;
  declare signerName: CreationOptional<string | null>;
  declare signerIp: CreationOptional<string | null>;
  declare signerUserAgent: CreationOptional<string | null>;
  declare signedPdfKey: CreationOptional<string | null>;
  declare signedPdfSha256: CreationOptional<string | null>;
  declare declinedAt: CreationOptional<Date | null>;
  declare declineReason: CreationOptional<string | null>;
  declare reminderSentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Payment extends Model<InferAttributes<Payment>, InferCreationAttributes<Payment>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare proposalId: number;
  declare jobId: number;
  declare kind: CreationOptional<"deposit">;
  declare amountCents: Num;
  declare currency: CreationOptional<string>;
  declare status: CreationOptional<PaymentStatus>;
  declare providerSessionId: CreationOptional<string | null>;
  declare providerPaymentIntentId: CreationOptional<string | null>;
  declare paidAt: CreationOptional<Date | null>;
  declare lastError: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class PaymentEvent extends Model<InferAttributes<PaymentEvent>, InferCreationAttributes<PaymentEvent>> {
  declare id: CreationOptional<number>;
  declare eventId: string;
  declare type: string;
  declare paymentId: number | null;
  declare receivedAt: Date;
  declare processedAt: Date | null;
}

export class RevisionPdf extends Model<InferAttributes<RevisionPdf>, InferCreationAttributes<RevisionPdf>> {
  declare revisionId: number;
  declare companyId: number;
  declare pdfKey: string;
  declare pdfSha256: string;
  declare createdAt: CreationOptional<Date>;
}

const id = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
const fk = (allowNull = false) => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull });
const date = () => ({ type: DataTypes.DATE, allowNull: true });

export function initProposalModels(sequelize: Sequelize): void {
  Proposal.init(
    {
      id: id(),
      companyId: fk(),
      quoteId: fk(),
      revisionId: fk(),
      jobId: fk(),
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
      status: { type: DataTypes.ENUM(...PROPOSAL_ROW_STATUSES), allowNull: false, defaultValue: "active" },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      sentTo: { type: DataTypes.STRING(320), allowNull: false },
      sentBy: fk(true),
      pdfKey: { type: DataTypes.STRING(80), allowNull: true },
      pdfSha256: { type: DataTypes.CHAR(64), allowNull: true },
      viewedAt: date(),
      lastViewedAt: date(),
      acceptedAt: date(),
      acceptedOptionId: fk(true),
      signerName: { type: DataTypes.STRING(200), allowNull: true },
      signerIp: { type: DataTypes.STRING(64), allowNull: true },
      signerUserAgent: { type: DataTypes.STRING(500), allowNull: true },
      signedPdfKey: { type: DataTypes.STRING(80), allowNull: true },
      signedPdfSha256: { type: DataTypes.CHAR(64), allowNull: true },
      declinedAt: date(),
      declineReason: { type: DataTypes.TEXT, allowNull: true },
      reminderSentAt: date(),
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "proposals", underscored: true },
  );
  Payment.init(
    {
      id: id(),
      companyId: fk(),
      proposalId: fk(),
      jobId: fk(),
      kind: { type: DataTypes.ENUM("deposit"), allowNull: false, defaultValue: "deposit" },
      amountCents: { type: DataTypes.BIGINT, allowNull: false },
      currency: { type: DataTypes.CHAR(3), allowNull: false, defaultValue: "usd" },
      status: { type: DataTypes.ENUM(...PAYMENT_STATUSES), allowNull: false, defaultValue: "pending" },
      providerSessionId: { type: DataTypes.STRING(255), allowNull: true },
      providerPaymentIntentId: { type: DataTypes.STRING(255), allowNull: true },
      paidAt: date(),
      lastError: { type: DataTypes.STRING(1000), allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "payments", underscored: true },
  );
  PaymentEvent.init(
    {
      id: id(),
      eventId: { type: DataTypes.STRING(255), allowNull: false },
      type: { type: DataTypes.STRING(100), allowNull: false },
      paymentId: fk(true),
      receivedAt: { type: DataTypes.DATE, allowNull: false },
      processedAt: date(),
    },
    { sequelize, tableName: "payment_events", underscored: true, timestamps: false },
  );
  RevisionPdf.init(
    {
      revisionId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
      companyId: fk(),
      pdfKey: { type: DataTypes.STRING(80), allowNull: false },
      pdfSha256: { type: DataTypes.CHAR(64), allowNull: false },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: "revision_pdfs", underscored: true, updatedAt: false },
  );
}
