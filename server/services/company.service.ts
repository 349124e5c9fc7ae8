import type { Sequelize, Transaction } from "sequelize";
import type { CompanyContactDto, CompanyDto, CompanyProfileInput } from "../../shared/schemas/price-book";
import { canSeePricing } from "../../shared/auth/roles";
import { Company } from "../models/index";
import { notFound } from "../errors";
import { recordAudit } from "./audit.service";
import { getPricingSettings } from "./pricing-settings";

type Actor = Express.User;

const PROFILE_FIELDS = [
  "name",
  "legalName",
  "licenceNumber",
  "addressLine1",
  "addressLine2",
  "city",
  "region",
  "postalCode",
  "phone",
  "email",
  "website",
  "proposalTerms",
  "exclusions",
  "warranty",
  "proposalPrefix",
  "nextProposalNumber",
] as const;

export const presentCompanyContact = (c: Company): CompanyContactDto => ({
  id: c.id,
  name: c.name,
  legalName: c.legalName ?? null,
  licenceNumber: c.licenceNumber ?? null,
  addressLine1: c.addressLine1 ?? null,
  addressLine2: c.addressLine2 ?? null,
  city: c.city ?? null,
  region: c.region ?? null,
  postalCode: c.postalCode ?? null,
  phone: c.phone ?? null,
  email: c.email ?? null,
  website: c.website ?? null,
  logoAttachmentKey: c.logoAttachmentKey ?? null,
});

export class CompanyService {
  constructor(private readonly sequelize: Sequelize) {}

  async get(actor: Actor): Promise<Company> {
    const c = await Company.findByPk(actor.companyId);
    if (!c) throw notFound("Company");
    return c;
  }

  /** Name and contact for everyone; proposal texts, numbering and pricing settings for owners and estimators only. */
  async present(c: Company, actor: Actor): Promise<CompanyDto> {
    const contact = presentCompanyContact(c);
    if (!canSeePricing(actor.role)) return contact;
    return {
      ...contact,
      proposalTerms: c.proposalTerms ?? null,
      exclusions: c.exclusions ?? null,
      warranty: c.warranty ?? null,
      proposalPrefix: c.proposalPrefix,
      nextProposalNumber: c.nextProposalNumber,
      settings: await getPricingSettings(c.id),
    };
  }

  async updateProfile(input: CompanyProfileInput, actor: Actor): Promise<Company> {
    return this.sequelize.transaction(async (transaction) => {
      const c = await Company.findByPk(actor.companyId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!c) throw notFound("Company");
      const next: Record<string, unknown> = {};
      for (const f of PROFILE_FIELDS) {
        const v = input[f];
        if (f === "nextProposalNumber" && v === undefined) continue; // numbering left as it is
        next[f] = v === undefined ? null : v;
      }
      const changes: Record<string, unknown> = {};
      for (const [k, v] of Object.entries(next)) {
        const before = (c as unknown as Record<string, unknown>)[k] ?? null;
        if (before !== v) changes[k] = k.length > 0 && typeof v === "string" && v.length > 200 ? { changed: true } : { from: before, to: v };
      }
      if (Object.keys(changes).length === 0) return c;
      await c.update(next, { transaction });
      await recordAudit(
        { companyId: c.id, actorId: actor.id, entityType: "company", entityId: c.id, action: "profile_updated", changes },
        transaction,
      );
      return c;
    });
  }
}

/**
 * The next proposal number ("QSS-1042"), taken in the caller's transaction: the company row is locked, so two
 * proposals never get the same number; a rolled-back transaction gives the number back.
 */
export async function allocateProposalNumber(companyId: number, transaction: Transaction): Promise<string> {
  const c = await Company.findByPk(companyId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!c) throw notFound("Company");
  const n = c.nextProposalNumber;
  await c.update({ nextProposalNumber: n + 1 }, { transaction });
  return `${c.proposalPrefix}${n}`;
}
