import type { Sequelize, Transaction } from "sequelize";
import type { CompanyContactDto, CompanyDto, CompanyProfileInput } from "../../shared/schemas/price-book";
import { canSeePricing } from "../../shared/auth/roles";
import { Company } from "../models/index";
import { fileTypeFromBuffer } from "file-type";
import sharp from "sharp";
import { HttpError, notFound } from "../errors";
import { newStorageKey, type Storage } from "../storage/storage";
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
  logoUrl: c.logoAttachmentKey ? `/api/company/logo?v=${encodeURIComponent(c.logoAttachmentKey.split("/").pop()!.slice(0, 8))}` : null,
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

/** The largest logo we keep, after resizing: enough for a proposal header at print resolution. */
export const LOGO_MAX_BYTES = 2 * 1024 * 1024;

/**
 * The company logo: a PNG or JPEG (checked from its content), resized to fit 600 × 200 px and kept as PNG
 * in storage under a generated key; the previous logo is removed once the new one is recorded.
 */
export class CompanyLogoService {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly storage: Storage,
  ) {}

  async set(buf: Buffer, actor: Actor): Promise<Company> {
    const type = await fileTypeFromBuffer(buf);
    if (!type || !["image/png", "image/jpeg", "image/webp"].includes(type.mime)) {
      throw new HttpError(415, "unsupported_type", "Use a PNG, JPEG or WebP image for the logo");
    }
    const png = await sharp(buf).rotate().resize({ width: 600, height: 200, fit: "inside", withoutEnlargement: true }).png().toBuffer();
    const key = newStorageKey(actor.companyId);
    await this.storage.put(key, png, "image/png");
    let previous: string | null = null;
    const company = await this.sequelize.transaction(async (transaction) => {
      const c = await Company.findByPk(actor.companyId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!c) throw notFound("Company");
      previous = c.logoAttachmentKey ?? null;
      await c.update({ logoAttachmentKey: key }, { transaction });
      await recordAudit({ companyId: c.id, actorId: actor.id, entityType: "company", entityId: c.id, action: "logo_set" }, transaction);
      return c;
    }).catch(async (err: unknown) => {
      await this.storage.delete(key);
      throw err;
    });
    if (previous) await this.storage.delete(previous);
    return company;
  }

  async remove(actor: Actor): Promise<void> {
    let previous: string | null = null;
    await this.sequelize.transaction(async (transaction) => {
      const c = await Company.findByPk(actor.companyId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!c) throw notFound("Company");
      previous = c.logoAttachmentKey ?? null;
      if (!previous) return;
      await c.update({ logoAttachmentKey: null }, { transaction });
      await recordAudit({ companyId: c.id, actorId: actor.id, entityType: "company", entityId: c.id, action: "logo_removed" }, transaction);
    });
    if (previous) await this.storage.delete(previous);
  }

  /** The logo's PNG bytes, or null when the company has none. */
  async read(companyId: number): Promise<Buffer | null> {
    const c = await Company.findByPk(companyId, { attributes: ["id", "logoAttachmentKey"] });
    if (!c?.logoAttachmentKey) return null;
    const data = await this.storage.get(c.logoAttachmentKey).catch(() => null);
    if (!data) return null;
    if (Buffer.isBuffer(data)) return data;
    const chunks: Buffer[] = [];
    for await (const chunk of data as AsyncIterable<Buffer>) chunks.push(Buffer.from(chunk));
    return Buffer.concat(chunks);
  }

  /** The logo as a data URL for the proposal PDF and page, or null. */
  async dataUrl(companyId: number): Promise<string | null> {
    const png = await this.read(companyId);
    return png ? `data:image/png;base64,${png.toString("base64")}` : null;
  }
}

