import type { Sequelize } from "sequelize";
import { Company, initCompany } from "./company.model";
import { User, initUser } from "./user.model";
import { Session, initSession } from "./session.model";
import { AuditEvent, initAuditEvent } from "./audit-event.model";
import { Customer, initCustomer } from "./customer.model";
import { Job, initJob } from "./job.model";
import { JobCrew, initJobCrew } from "./job-crew.model";
import { Roof, initRoof } from "./roof.model";
import { CatalogItem, initCatalogItem } from "./catalog-item.model";
import { CatalogItemPrice, initCatalogItemPrice } from "./catalog-item-price.model";
import { LaborRate, initLaborRate } from "./labor-rate.model";
import { CompanySettings, initCompanySettings } from "./company-settings.model";
import { initMailModels } from "./mail.models";
import { Approval, Quote, QuoteLine, QuoteOption, QuoteRevision, initQuoteModels } from "./quote.models";
import { Attachment, initAttachment } from "./attachment.model";
import { Payment, PaymentEvent, Proposal, RevisionPdf, initProposalModels } from "./proposal.models";
import { RateLimitHit, initRateLimitHit } from "./rate-limit-hit.model";

let initialisedWith: Sequelize | null = null;

/** Binds every model to one Sequelize instance (once per process) and sets up associations. */
export function initModels(sequelize: Sequelize): void {
  if (initialisedWith === sequelize) return;
  initCompany(sequelize);
  initUser(sequelize);
  initSession(sequelize);
  initAuditEvent(sequelize);
  Company.hasMany(User, { foreignKey: "companyId" });
  User.belongsTo(Company, { foreignKey: "companyId" });
  initCustomer(sequelize);
  initJob(sequelize);
  initJobCrew(sequelize);
  initRoof(sequelize);
  Job.belongsTo(Customer, { as: "customer", foreignKey: "customerId" });
  Job.belongsTo(User, { as: "estimator", foreignKey: "estimatorId" });
  Job.belongsToMany(User, { as: "crew", through: JobCrew, foreignKey: "jobId", otherKey: "userId" });
  Job.hasOne(Roof, { as: "roof", foreignKey: "jobId" });
  AuditEvent.belongsTo(User, { as: "actor", foreignKey: "actorId", constraints: false });
  initCatalogItem(sequelize);
  initCatalogItemPrice(sequelize);
  initLaborRate(sequelize);
  initCompanySettings(sequelize);
  CatalogItem.hasMany(CatalogItemPrice, { as: "prices", foreignKey: "itemId" });
  initMailModels(sequelize);
  initQuoteModels(sequelize);
  Quote.hasMany(QuoteRevision, { as: "revisions", foreignKey: "quoteId" });
  QuoteRevision.hasMany(QuoteOption, { as: "options", foreignKey: "revisionId" });
  QuoteOption.hasMany(QuoteLine, { as: "lines", foreignKey: "optionId" });
  QuoteRevision.belongsTo(User, { as: "creator", foreignKey: "createdBy", constraints: false });
  QuoteRevision.belongsTo(User, { as: "submitter", foreignKey: "submittedBy", constraints: false });
  QuoteRevision.belongsTo(User, { as: "approver", foreignKey: "approvedBy", constraints: false });
  QuoteRevision.belongsTo(User, { as: "returner", foreignKey: "returnedBy", constraints: false });
  initAttachment(sequelize);
  Attachment.belongsTo(User, { as: "uploader", foreignKey: "uploadedBy", constraints: false });
  initProposalModels(sequelize);
  initRateLimitHit(sequelize);
  initialisedWith = sequelize;
}

export { Company, User, Session, AuditEvent };
export { Customer, Job, JobCrew, Roof };
export { CatalogItem, CatalogItemPrice, LaborRate, CompanySettings };
export { Quote, QuoteRevision, QuoteOption, QuoteLine, Approval };
export { Attachment };
export { Proposal, Payment, PaymentEvent, RevisionPdf };
export { RateLimitHit };
