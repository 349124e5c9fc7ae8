/**
 * Proposals: the PDF of a quote revision, sending it to the homeowner (a new private link each time, the
 * older links revoked), and what the homeowner does with the link (view, accept with a typed name, decline).
 *
 * - The link's token is 32 random bytes (base64url). Only its SHA-256 is stored; a lookup hashes the
 *   token and reads the row by that hash (the hash, not the token, meets the index), then compares the
 *   hashes in constant time.
 * - The PDF of a frozen revision is rendered once and kept in Storage with its SHA-256: the office copy of
 *   an approved revision (revision_pdfs), the copy sent with each link (proposals.pdf_key) and, on
 *   acceptance, the signed copy (proposals.signed_pdf_key). A draft renders fresh every time.
 * - Every change runs in one transaction with its audit rows, the job's status move and its e-mails
 *   (outbox). Locks: job, then quote, then revision, then proposal, as QuotesService does.
 */
import { createHash, randomBytes, timingSafeEqual } from "node:crypto";
import type { Sequelize, Transaction } from "sequelize";
import type { TakeoffResult } from "../../shared/engine/types";
import type { JobStatus } from "../../shared/schemas/job";
import { formatDate, formatMoney, type ProposalDocDto } from "../../shared/schemas/proposal";
import type {
  DepositDto,
  ProposalAcceptInput,
  ProposalDeclineInput,
  ProposalDto,
  ProposalSendInput,
  PublicProposalDto,
} from "../../shared/schemas/proposal-api";
import type { QuoteStatus } from "../../shared/schemas/quote";
import type { Config } from "../config";
import { badRequest, conflict, notFound } from "../errors";
import type { Logger } from "../logger";
import { emailLayout, escapeHtml } from "../mail/templates";
import { Company, Customer, Job, Payment, Proposal, Quote, QuoteOption, QuoteRevision, RevisionPdf, User } from "../models/index";
import { renderProposalPdfInWorker } from "../pdf/pdf-worker";
import { parseJsonColumn } from "../presenters/job.presenter";
import { newStorageKey, type Storage } from "../storage/storage";
import { recordAudit } from "./audit.service";
import { JobsService } from "./jobs.service";
import { enqueueEmail } from "./outbox.service";
import { refreshJobQuoteTotal } from "./quotes.service";
import { getPricingSettings } from "./pricing-settings";
import { buildProposalDoc, type ContentOptionInput, type ContentRoofInput, type OptionSpec } from "./proposal-content";
import type { FrozenPriceBook } from "./quote-pricing";

type Actor = Express.User;

const DAY_MS = 86_400_000;
const num = (v: string | number | bigint | null | undefined) => (v === null || v === undefined ? 0 : Number(v));
const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

// ---- tokens ----------------------------------------------------------------------------------------

/** A new link token: 256 random bits, URL-safe. */
export const newProposalToken = () => randomBytes(32).toString("base64url");
/** What is stored of a token: its SHA-256, hex. */
export const hashProposalToken = (token: string) => createHash("sha256").update(token, "utf8").digest("hex");
/** A token as issued: 43 base64url characters (anything else is not looked up at all). */
const TOKEN_RE = /^[A-Za-z0-9_-]{43}$/;
export const sha256 = (buf: Buffer) => createHash("sha256").update(buf).digest("hex");

/** The one answer for an unknown, revoked or expired link (identical bodies: it leaks nothing). */
export const linkNotFound = () => notFound("Proposal");

/**
 * The homeowner acts without an account: audit rows and job moves they cause have no actor. JobsService
 * .applyStatus only reads `id` (for the audit row's actor), which is null here.
 */
export const homeownerActor = (companyId: number): Actor => ({ id: null as unknown as number, companyId, role: "owner", email: "", name: "homeowner" }) as unknown as Actor;

export interface ProposalsDeps {
  sequelize: Sequelize;
  storage: Storage;
  config: Pick<Config, "publicUrl" | "mail">;
  logger?: Logger;
}

/** Everything a revision's document is built from. */
interface RevisionWorld {
  quote: Quote;
  rev: QuoteRevision;
  job: Job;
  customer: Customer;
  company: Company;
  options: QuoteOption[];
}

export const proposalLink = (publicUrl: string, token: string) => `${publicUrl.replace(/\/+$/, "")}/p/${token}`;

export class ProposalsService {
  private readonly jobs: JobsService;

  constructor(private readonly deps: ProposalsDeps) {
    this.jobs = new JobsService(deps.sequelize);
  }

  private get sequelize() {
    return this.deps.sequelize;
  }

  // ---- documents and PDFs ------------------------------------------------------------------------

  private async world(quote: Quote, rev: QuoteRevision, t?: Transaction): Promise<RevisionWorld> {
    const [job, company, options] = await Promise.all([
      Job.findByPk(quote.jobId, { transaction: t }),
      Company.findByPk(quote.companyId, { transaction: t }),
      QuoteOption.findAll({ where: { revisionId: rev.id }, order: [["position", "ASC"]], transaction: t }),
    ]);
    if (!job || !company) throw notFound("Quote");
    const customer = await Customer.findByPk(job.customerId, { transaction: t });
    if (!customer) throw notFound("Quote");
    return { quote, rev, job, customer, company, options };
  }

  private async logoDataUrl(company: Company): Promise<string | null> {
    if (!company.logoAttachmentKey) return null;
    try {
      const buf = await readAll(this.deps.storage, company.logoAttachmentKey);
      const mime = buf[0] === 0x89 && buf[1] === 0x50 ? "image/png" : buf[0] === 0xff && buf[1] === 0xd8 ? "image/jpeg" : null;
      return mime ? `data:${mime};base64,${buf.toString("base64")}` : null;
    } catch {
      return null;
    }
  }

  /** The document of a revision, as of `status`, with the link, issue and expiry dates and an acceptance. */
  async buildDoc(
    w: RevisionWorld,
    opts: {
      status: QuoteStatus;
      acceptUrl: string;
      issuedAt: Date;
      validUntil?: Date | null;
      acceptance?: { signerName: string; acceptedAt: Date; optionId: number } | null;
    },
    t?: Transaction,
  ): Promise<ProposalDocDto> {
    const book = parseJsonColumn<FrozenPriceBook>(w.rev.priceBookSnapshot);
    const settings = await getPricingSettings(w.quote.companyId, t);
    const roof = parseJsonColumn<ContentRoofInput>(w.rev.roofSnapshot);
    const c = w.company;
    const options: ContentOptionInput[] = w.options.map((o) => ({
      id: o.id,
      label: o.label,
      spec: parseJsonColumn<OptionSpec | null>(o.spec),
      takeoff: parseJsonColumn<TakeoffResult>(o.takeoff),
      totals: { priceCents: num(o.priceCents), taxCents: num(o.taxCents), totalCents: num(o.totalCents), depositCents: num(o.depositCents) },
    }));
    return buildProposalDoc({
      company: {
        name: c.name,
        legalName: c.legalName,
        licenceNumber: c.licenceNumber,
        addressLine1: c.addressLine1,
        addressLine2: c.addressLine2,
        city: c.city,
        region: c.region,
        postalCode: c.postalCode,
        phone: c.phone,
        email: c.email,
        website: c.website,
        proposalTerms: c.proposalTerms,
        exclusions: c.exclusions,
        warranty: c.warranty,
        logoDataUrl: await this.logoDataUrl(c),
      },
      customer: w.customer,
      job: {
        id: w.job.id,
        siteAddressLine1: w.job.siteAddressLine1,
        siteAddressLine2: w.job.siteAddressLine2,
        siteCity: w.job.siteCity,
        siteRegion: w.job.siteRegion,
        sitePostalCode: w.job.sitePostalCode,
        site: parseJsonColumn<unknown>(w.rev.siteSnapshot),
      },
      quote: { number: w.quote.number, revisionNo: w.rev.revisionNo, status: opts.status },
      roof: { planes: roof.planes, stacks: roof.stacks, defaultStackId: roof.defaultStackId },
      options,
      settings: { depositPct: book?.priceBook?.settings?.depositPct ?? settings.depositPct, proposalValidityDays: settings.proposalValidityDays },
      issuedAt: opts.issuedAt.toISOString(),
      validUntil: opts.validUntil ? opts.validUntil.toISOString() : null,
      acceptUrl: opts.acceptUrl,
      acceptance: opts.acceptance
        ? { signerName: opts.acceptance.signerName, acceptedAt: opts.acceptance.acceptedAt.toISOString(), optionId: opts.acceptance.optionId }
        : null,
    });
  }

  /** Renders and stores a PDF; returns its key and SHA-256. */
  private async renderAndStore(doc: ProposalDocDto, companyId: number): Promise<{ pdf: Buffer; key: string; sha: string }> {
    const pdf = await renderProposalPdfInWorker(doc);
    const key = newStorageKey(companyId);
    await this.deps.storage.put(key, pdf, "application/pdf");
    return { pdf, key, sha: sha256(pdf) };
  }

  /**
   * GET /api/quotes/:id/pdf: the current revision's PDF. A draft (or one in review) renders fresh, marked
   * draft; a sent or decided revision gives the copy the homeowner got (the signed copy once accepted);
   * an approved revision not sent yet is rendered once and kept.
   */
  async officePdf(quoteId: number, actor: Actor): Promise<{ pdf: Buffer; filename: string }> {
    const quote = await Quote.findOne({ where: { id: quoteId, companyId: actor.companyId } });
    if (!quote || !quote.currentRevisionId) throw notFound("Quote");
    const rev = await QuoteRevision.findByPk(quote.currentRevisionId);
    if (!rev) throw notFound("Quote");
    const filename = `proposal-${quote.number}-r${rev.revisionNo}.pdf`.replace(/[^A-Za-z0-9._-]/g, "_");
    const placeholder = `${this.deps.config.publicUrl.replace(/\/+$/, "")}/p/…`;
    if (rev.status === "draft" || rev.status === "in_review") {
      const w = await this.world(quote, rev);
      const doc = await this.buildDoc(w, { status: rev.status, acceptUrl: placeholder, issuedAt: new Date() });
      return { pdf: await renderProposalPdfInWorker(doc), filename };
    }
    const latest = await Proposal.findOne({ where: { revisionId: rev.id }, order: [["id", "DESC"]] });
    if (latest) {
      const key = latest.signedPdfKey ?? latest.pdfKey;
      if (key) return { pdf: await readAll(this.deps.storage, key), filename };
    }
    const kept = await RevisionPdf.findByPk(rev.id);
    if (kept && (await this.deps.storage.exists(kept.pdfKey))) return { pdf: await readAll(this.deps.storage, kept.pdfKey), filename };
    const w = await this.world(quote, rev);
    const doc = await this.buildDoc(w, { status: rev.status, acceptUrl: placeholder, issuedAt: rev.approvedAt ?? rev.updatedAt });
    const { pdf, key, sha } = await this.renderAndStore(doc, quote.companyId);
    // Two first requests at once: the first row wins; the other's file is removed.
    const [row, created] = await RevisionPdf.findOrCreate({ where: { revisionId: rev.id }, defaults: { revisionId: rev.id, companyId: quote.companyId, pdfKey: key, pdfSha256: sha } });
    if (!created && row.pdfKey !== key) {
      await this.deps.storage.delete(key).catch(() => undefined);
      return { pdf: await readAll(this.deps.storage, row.pdfKey), filename };
    }
    return { pdf, filename };
  }

  // ---- send ------------------------------------------------------------------------------------

  /**
   * Sends (or resends) the quote's current revision: approved or sent only (else 409 invalid_transition).
   * One transaction: older links of this quote revoked, a new proposal with its stored PDF, revision and
   * quote → sent, job → proposed, audit rows, and the e-mail (PDF attached, the link) in the outbox.
   */
  async send(quoteId: number, input: ProposalSendInput, actor: Actor): Promise<Proposal> {
    const written: string[] = [];
    try {
      return await this.sequelize.transaction(async (t) => {
        const { quote, rev, job } = await lockQuote(quoteId, actor.companyId, t);
        if (rev.status !== "approved" && rev.status !== "sent") {
          throw conflict("invalid_transition", `A quote that is ${rev.status.replace("_", " ")} cannot be sent; only an approved quote can`, {
            currentStatus: rev.status,
          });
        }
        const w = await this.world(quote, rev, t);
        const to = input.to ?? w.customer.email ?? null;
        if (!to) throw badRequest("Please check the highlighted fields", { to: "The customer has no e-mail address; enter one" });
        const sender = await User.findByPk(actor.id, { transaction: t });

        const revoked = await Proposal.update(
          { status: "revoked" },
          { where: { quoteId: quote.id, status: "active" }, transaction: t },
        );
        const settings = await getPricingSettings(quote.companyId, t);
        const now = new Date();
        const expiresAt = new Date(now.getTime() + settings.proposalValidityDays * DAY_MS);
        const token = newProposalToken();
        const link = proposalLink(this.deps.config.publicUrl, token);
        const doc = await this.buildDoc(w, { status: "sent", acceptUrl: link, issuedAt: now, validUntil: expiresAt }, t);
        const { pdf, key, sha } = await this.renderAndStore(doc, quote.companyId);
        written.push(key);
        const proposal = await Proposal.create(
          {
            companyId: quote.companyId,
            quoteId: quote.id,
            revisionId: rev.id,
            jobId: job.id,
            tokenHash: hashProposalToken(token),
            status: "active",
            expiresAt,
            sentTo: to,
            sentBy: actor.id,
            pdfKey: key,
            pdfSha256: sha,
          },
          { transaction: t },
        );
        const wasStatus = rev.status;
        if (rev.status !== "sent") {
          await rev.update({ status: "sent", version: rev.version + 1, sentAt: now }, { transaction: t });
        } else {
          await rev.update({ sentAt: now }, { transaction: t });
        }
        await quote.update({ status: "sent" }, { transaction: t });
        await recordAudit(
          {
            companyId: quote.companyId,
            actorId: actor.id,
            entityType: "quote",
            entityId: quote.id,
            jobId: job.id,
            action: wasStatus === "sent" ? "resent" : "sent",
            changes: { number: quote.number, revisionNo: rev.revisionNo, proposalId: proposal.id, to, revokedLinks: revoked[0], status: { from: wasStatus, to: "sent" } },
          },
          t,
        );
        if ((["lead", "estimating", "lost"] as JobStatus[]).includes(job.status as JobStatus)) {
          await this.jobs.applyStatus(job, "proposed", `proposal ${quote.number} sent`, actor, t);
        }
        const mail = proposalEmail({
          companyName: w.company.name,
          customerName: w.customer.name,
          number: quote.number,
          link,
          expiresAt,
          message: input.message ?? null,
          fromName: sender?.name ?? w.company.name,
          totals: w.options.map((o) => ({ label: o.label, totalCents: num(o.totalCents) })),
        });
        await enqueueEmail(
          {
            to,
            cc: input.copyToMe && sender?.email && sender.email !== to ? sender.email : undefined,
            ...(sender?.email ? { headers: { "Reply-To": sender.email } } : {}),
            ...mail,
            attachments: [{ filename: `proposal-${quote.number}.pdf`, contentType: "application/pdf", content: pdf }],
          },
          { transaction: t, companyId: quote.companyId, kind: "proposal" },
        );
        return proposal;
      });
    } catch (err) {
      await Promise.all(written.map((k) => this.deps.storage.delete(k).catch(() => undefined)));
      throw err;
    }
  }

  // ---- the office's view -----------------------------------------------------------------------

  /** GET /api/jobs/:id/proposals: newest first. */
  async listForJob(jobId: number, actor: Actor): Promise<ProposalDto[]> {
    await this.jobs.get(jobId, actor);
    const rows = await Proposal.findAll({ where: { jobId, companyId: actor.companyId }, order: [["createdAt", "DESC"], ["id", "DESC"]] });
    return this.present(rows);
  }

  /** The DTOs of proposals (their revision numbers, chosen option labels and deposits in three queries). */
  async present(rows: Proposal[]): Promise<ProposalDto[]> {
    if (rows.length === 0) return [];
    const [revs, options, payments] = await Promise.all([
      QuoteRevision.findAll({ where: { id: [...new Set(rows.map((r) => r.revisionId))] }, attributes: ["id", "revisionNo"] }),
      QuoteOption.findAll({
        where: { id: rows.map((r) => r.acceptedOptionId).filter((x): x is number => x !== null) },
        attributes: ["id", "label"],
      }),
      Payment.findAll({ where: { proposalId: rows.map((r) => r.id) }, order: [["id", "ASC"]] }),
    ]);
    const revNo = new Map(revs.map((r) => [r.id, r.revisionNo]));
    const label = new Map(options.map((o) => [o.id, o.label]));
    const deposit = new Map<number, DepositDto>();
    for (const p of payments) deposit.set(p.proposalId, pickDeposit(deposit.get(p.proposalId), p));
    return rows.map((r) => ({
      id: r.id,
      quoteId: r.quoteId,
      revisionNo: revNo.get(r.revisionId) ?? 0,
      status: r.status,
      sentTo: r.sentTo,
      sentAt: r.createdAt.toISOString(),
      expiresAt: r.expiresAt.toISOString(),
      viewedAt: iso(r.viewedAt),
      acceptedAt: iso(r.acceptedAt),
      acceptedOptionId: r.acceptedOptionId,
      acceptedOptionLabel: r.acceptedOptionId ? (label.get(r.acceptedOptionId) ?? null) : null,
      signerName: r.signerName,
      declinedAt: iso(r.declinedAt),
      declineReason: r.declineReason,
      deposit: deposit.get(r.id) ?? null,
    }));
  }

  // ---- the homeowner's link --------------------------------------------------------------------

  /** The proposal of a live link (not revoked, not expired), or the one 404. `lock` locks the row. */
  async byToken(token: string, t?: Transaction): Promise<Proposal> {
    if (typeof token !== "string" || !TOKEN_RE.test(token)) throw linkNotFound();
    const hash = hashProposalToken(token);
    const row = await Proposal.findOne({ where: { tokenHash: hash }, transaction: t, lock: t ? t.LOCK.UPDATE : undefined });
    if (!row || !timingSafeEqual(Buffer.from(row.tokenHash, "hex"), Buffer.from(hash, "hex"))) throw linkNotFound();
    if (row.status === "revoked" || row.status === "expired") throw linkNotFound();
    if (row.status === "active" && row.expiresAt.getTime() <= Date.now()) throw linkNotFound();
    return row;
  }

  /** GET /api/proposals/:token: the first view is recorded. */
  async view(token: string): Promise<PublicProposalDto> {
    const p = await this.byToken(token);
    const now = new Date();
    await Proposal.update({ viewedAt: now }, { where: { id: p.id, viewedAt: null }, silent: true });
    await Proposal.update({ lastViewedAt: now }, { where: { id: p.id }, silent: true });
    const fresh = (await Proposal.findByPk(p.id))!;
    return this.publicDto(fresh, token);
  }

  async publicDto(p: Proposal, token: string): Promise<PublicProposalDto> {
    const quote = (await Quote.findByPk(p.quoteId))!;
    const rev = (await QuoteRevision.findByPk(p.revisionId))!;
    const w = await this.world(quote, rev);
    const status: QuoteStatus = p.status === "accepted" ? "accepted" : p.status === "declined" ? "declined" : "sent";
    const doc = await this.buildDoc(w, {
      status,
      acceptUrl: proposalLink(this.deps.config.publicUrl, token),
      issuedAt: p.createdAt,
      validUntil: p.expiresAt,
      acceptance: p.status === "accepted" ? { signerName: p.signerName!, acceptedAt: p.acceptedAt!, optionId: p.acceptedOptionId! } : null,
    });
    const payments = await Payment.findAll({ where: { proposalId: p.id }, order: [["id", "ASC"]] });
    let deposit: DepositDto | undefined;
    for (const pay of payments) deposit = pickDeposit(deposit, pay);
    const chosen = w.options.find((o) => o.id === p.acceptedOptionId);
    return {
      status: p.status,
      expiresAt: p.expiresAt.toISOString(),
      doc,
      options: w.options.map((o) => ({
        id: o.id,
        label: o.label,
        totalCents: num(o.totalCents),
        depositCents: num(o.depositCents),
        priceCents: num(o.priceCents),
        taxCents: num(o.taxCents),
      })),
      accepted:
        p.status === "accepted"
          ? { at: p.acceptedAt!.toISOString(), optionId: p.acceptedOptionId!, optionLabel: chosen?.label ?? "", signerName: p.signerName! }
          : null,
      declined: p.status === "declined" ? { at: p.declinedAt!.toISOString(), reason: p.declineReason } : null,
      deposit: deposit ? { status: deposit.status, amountCents: deposit.amountCents } : null,
    };
  }

  /** GET /api/proposals/:token/pdf: the signed copy once accepted, else the copy that was sent. */
  async publicPdf(token: string): Promise<{ pdf: Buffer; filename: string }> {
    const p = await this.byToken(token);
    const key = p.signedPdfKey ?? p.pdfKey;
    if (!key) throw linkNotFound();
    const quote = await Quote.findByPk(p.quoteId, { attributes: ["number"] });
    const suffix = p.signedPdfKey ? "-signed" : "";
    return { pdf: await readAll(this.deps.storage, key), filename: `proposal-${quote?.number ?? p.id}${suffix}.pdf`.replace(/[^A-Za-z0-9._-]/g, "_") };
  }

  /** Locks job, quote, revision and the proposal of a live link; 409 when it was already decided or superseded. */
  private async lockLink(token: string, t: Transaction) {
    const found = await this.byToken(token);
    const { quote, rev, job } = await lockQuote(found.quoteId, found.companyId, t, { allowArchived: true });
    const p = await this.byToken(token, t); // locked, and checked again under the lock
    if (p.status === "accepted" || p.status === "declined") {
      throw conflict("already_decided", `This proposal was already ${p.status}`, { currentStatus: p.status });
    }
    if (quote.currentRevisionId !== p.revisionId || rev.status !== "sent") {
      throw conflict("superseded", "This proposal was replaced by a newer one; please use the latest link you received", { currentStatus: rev.status });
    }
    return { p, quote, rev, job };
  }

  /**
   * POST /api/proposals/:token/accept: records the signer, freezes the signed PDF (rendered once, stored
   * with its SHA-256), quote → accepted, job → won, and e-mails the signed copy to the homeowner and the
   * estimator.
   */
  async accept(token: string, input: ProposalAcceptInput, meta: { ip: string | null; userAgent: string | null }): Promise<Proposal> {
    const written: string[] = [];
    try {
      return await this.sequelize.transaction(async (t) => {
        const { p, quote, rev, job } = await this.lockLink(token, t);
        const w = await this.world(quote, rev, t);
        const option = w.options.find((o) => o.id === input.optionId);
        if (!option) throw badRequest("Please check the highlighted fields", { optionId: "Choose one of the options in this proposal" });
        const now = new Date();
        const doc = await this.buildDoc(
          w,
          {
            status: "accepted",
            acceptUrl: proposalLink(this.deps.config.publicUrl, token),
            issuedAt: p.createdAt,
            validUntil: p.expiresAt,
            acceptance: { signerName: input.signerName, acceptedAt: now, optionId: option.id },
          },
          t,
        );
        const { pdf, key, sha } = await this.renderAndStore(doc, quote.companyId);
        written.push(key);
        await p.update(
          {
            status: "accepted",
            acceptedAt: now,
            acceptedOptionId: option.id,
            signerName: input.signerName,
            signerIp: meta.ip?.slice(0, 64) ?? null,
            signerUserAgent: meta.userAgent?.slice(0, 500) ?? null,
            signedPdfKey: key,
            signedPdfSha256: sha,
          },
          { transaction: t },
        );
        await rev.update({ status: "accepted", version: rev.version + 1, decidedAt: now }, { transaction: t });
        await quote.update({ status: "accepted" }, { transaction: t });
        await refreshJobQuoteTotal(this.deps.sequelize, quote.jobId, t); // the board shows the accepted option's total
        await recordAudit(
          {
            companyId: quote.companyId,
            actorId: null,
            entityType: "quote",
            entityId: quote.id,
            jobId: job.id,
            action: "accepted",
            changes: {
              number: quote.number,
              revisionNo: rev.revisionNo,
              proposalId: p.id,
              optionId: option.id,
              optionLabel: option.label,
              signerName: input.signerName,
              signerIp: meta.ip,
              signedPdfSha256: sha,
              status: { from: "sent", to: "accepted" },
            },
          },
          t,
        );
        await this.jobs.applyStatus(job, "won", `proposal ${quote.number} accepted`, homeownerActor(quote.companyId), t);

        const attachment = { filename: `proposal-${quote.number}-signed.pdf`, contentType: "application/pdf", content: pdf };
        const link = proposalLink(this.deps.config.publicUrl, token);
        const homeowner = signedCopyEmail({ companyName: w.company.name, customerName: w.customer.name, number: quote.number, optionLabel: option.label, totalCents: num(option.totalCents), depositCents: num(option.depositCents), link, signerName: input.signerName, acceptedAt: now });
        await enqueueEmail({ to: p.sentTo, ...homeowner, attachments: [attachment] }, { transaction: t, companyId: quote.companyId, kind: "proposal_signed" });
        const estimatorEmail = await this.estimatorEmail(job, p, t);
        if (estimatorEmail) {
          const office = acceptedNoticeEmail({ customerName: w.customer.name, number: quote.number, optionLabel: option.label, totalCents: num(option.totalCents), signerName: input.signerName, acceptedAt: now, jobId: job.id, publicUrl: this.deps.config.publicUrl });
          await enqueueEmail({ to: estimatorEmail, ...office, attachments: [attachment] }, { transaction: t, companyId: quote.companyId, kind: "proposal_accepted" });
        }
        return p;
      });
    } catch (err) {
      await Promise.all(written.map((k) => this.deps.storage.delete(k).catch(() => undefined)));
      throw err;
    }
  }

  /** POST /api/proposals/:token/decline: quote → declined, job → lost. */
  async decline(token: string, input: ProposalDeclineInput): Promise<Proposal> {
    return this.sequelize.transaction(async (t) => {
      const { p, quote, rev, job } = await this.lockLink(token, t);
      const now = new Date();
      const reason = input.reason?.trim() || null;
      await p.update({ status: "declined", declinedAt: now, declineReason: reason }, { transaction: t });
      await rev.update({ status: "declined", version: rev.version + 1, decidedAt: now }, { transaction: t });
      await quote.update({ status: "declined" }, { transaction: t });
      await recordAudit(
        {
          companyId: quote.companyId,
          actorId: null,
          entityType: "quote",
          entityId: quote.id,
          jobId: job.id,
          action: "declined",
          changes: { number: quote.number, revisionNo: rev.revisionNo, proposalId: p.id, reason, status: { from: "sent", to: "declined" } },
        },
        t,
      );
      if (job.status === "proposed") await this.jobs.applyStatus(job, "lost", `proposal ${quote.number} declined`, homeownerActor(quote.companyId), t);
      return p;
    });
  }

  /** The estimator's address (the job's estimator, else whoever sent the proposal). */
  async estimatorEmail(job: Job, p: Proposal, t?: Transaction): Promise<string | null> {
    const ids = [job.estimatorId, p.sentBy].filter((x): x is number => x !== null);
    for (const id of ids) {
      const u = await User.findByPk(id, { attributes: ["email", "active"], transaction: t });
      if (u?.email && u.active) return u.email;
    }
    return null;
  }
}

/** A paid row wins; otherwise the newest. */
export function pickDeposit(current: DepositDto | undefined, p: Payment): DepositDto {
  const next: DepositDto = { status: p.status, amountCents: num(p.amountCents), paidAt: iso(p.paidAt) };
  if (current?.status === "paid") return current;
  return next;
}

// ---- locking and storage helpers ---------------------------------------------------------------

/** Locks the job row, then the quote and its current revision (the order QuotesService uses). */
export async function lockQuote(quoteId: number, companyId: number, t: Transaction, opts: { allowArchived?: boolean } = {}) {
  const found = await Quote.findOne({ where: { id: quoteId, companyId }, attributes: ["id", "jobId"], transaction: t });
  if (!found) throw notFound("Quote");
  const job = await Job.findOne({ where: { id: found.jobId, companyId }, transaction: t, lock: t.LOCK.UPDATE });
  const quote = await Quote.findOne({ where: { id: quoteId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!job || !quote || !quote.currentRevisionId) throw notFound("Quote");
  if (quote.archivedAt && !opts.allowArchived) throw conflict("archived", "This quote is archived; restore it to make changes");
  const rev = await QuoteRevision.findOne({ where: { id: quote.currentRevisionId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!rev) throw notFound("Quote");
  return { quote, rev, job };
}

export async function readAll(storage: Storage, key: string): Promise<Buffer> {
  const got = await storage.get(key);
  if (Buffer.isBuffer(got)) return got;
  const chunks: Buffer[] = [];
  for await (const chunk of got as AsyncIterable<Buffer | string>) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk));
  return Buffer.concat(chunks);
}

// ---- e-mails -------------------------------------------------------------------------------------

const button = (href: string, label: string) =>
  `<p><a href="${escapeHtml(href)}" style="display:inline-block;background:#1f4e79;color:#ffffff;padding:10px 18px;border-radius:6px;text-decoration:none">${escapeHtml(label)}</a></p>`;

export function proposalEmail(input: {
  companyName: string;
  customerName: string;
  number: string;
  link: string;
  expiresAt: Date;
  message: string | null;
  fromName: string;
  totals: { label: string; totalCents: number }[];
}) {
  const subject = `Your metal roof proposal ${input.number} from ${input.companyName}`;
  const until = formatDate(input.expiresAt.toISOString());
  const totals = input.totals.map((o) => `${o.label}: ${formatMoney(o.totalCents)}`);
  const text = [
    `Hello ${input.customerName},`,
    "",
    ...(input.message ? [input.message, ""] : []),
    `Your proposal ${input.number} is attached as a PDF and waits for you online:`,
    "",
    input.link,
    "",
    ...totals,
    "",
    `On that page you can choose an option, accept it by typing your full name, and pay the deposit. The proposal is valid until ${until}.`,
    "The link is private to you; please don't forward it.",
    "",
    input.fromName,
    input.companyName,
  ].join("\n");
  const html = emailLayout(
    subject,
    `<p>Hello ${escapeHtml(input.customerName)},</p>
${input.message ? `<p>${escapeHtml(input.message).replace(/\n/g, "<br>")}</p>` : ""}
<p>Your proposal ${escapeHtml(input.number)} is attached as a PDF and waits for you online.</p>
<ul>${totals.map((t) => `<li>${escapeHtml(t)}</li>`).join("")}</ul>
${button(input.link, "Open your proposal")}
<p style="font-size:13px;color:#52606d">Or copy this address into your browser:<br>${escapeHtml(input.link)}</p>
<p>On that page you can choose an option, accept it by typing your full name, and pay the deposit. The proposal is valid until ${escapeHtml(until)}.</p>
<p style="font-size:13px;color:#52606d">The link is private to you; please don't forward it.</p>
<p>${escapeHtml(input.fromName)}<br>${escapeHtml(input.companyName)}</p>`,
  );
  return { subject, text, html };
}

export function signedCopyEmail(input: {
  companyName: string;
  customerName: string;
  number: string;
  optionLabel: string;
  totalCents: number;
  depositCents: number;
  link: string;
  signerName: string;
  acceptedAt: Date;
}) {
  const subject = `Your signed proposal ${input.number}`;
  const text = [
    `Hello ${input.customerName},`,
    "",
    `Thank you: ${input.signerName} accepted proposal ${input.number} (${input.optionLabel}, ${formatMoney(input.totalCents)}) on ${input.acceptedAt.toISOString().slice(0, 16).replace("T", " ")} UTC.`,
    "Your signed copy is attached. Keep it for your records.",
    "",
    `To reserve your place in our schedule, pay the deposit of ${formatMoney(input.depositCents)} on your proposal page:`,
    input.link,
    "",
    input.companyName,
  ].join("\n");
  const html = emailLayout(
    subject,
    `<p>Hello ${escapeHtml(input.customerName)},</p>
<p>Thank you: ${escapeHtml(input.signerName)} accepted proposal ${escapeHtml(input.number)} (${escapeHtml(input.optionLabel)}, ${escapeHtml(formatMoney(input.totalCents))}) on ${escapeHtml(input.acceptedAt.toISOString().slice(0, 16).replace("T", " "))} UTC.</p>
<p>Your signed copy is attached. Keep it for your records.</p>
<p>To reserve your place in our schedule, pay the deposit of ${escapeHtml(formatMoney(input.depositCents))} on your proposal page:</p>
${button(input.link, "Pay the deposit")}
<p>${escapeHtml(input.companyName)}</p>`,
  );
  return { subject, text, html };
}

export function acceptedNoticeEmail(input: {
  customerName: string;
  number: string;
  optionLabel: string;
  totalCents: number;
  signerName: string;
  acceptedAt: Date;
  jobId: number;
  publicUrl: string;
}) {
  const subject = `Accepted: ${input.number} by ${input.customerName}`;
  const jobUrl = `${input.publicUrl.replace(/\/+$/, "")}/jobs/${input.jobId}`;
  const text = [
    `${input.signerName} accepted proposal ${input.number} for ${input.customerName}: ${input.optionLabel}, ${formatMoney(input.totalCents)}.`,
    `Accepted ${input.acceptedAt.toISOString().slice(0, 16).replace("T", " ")} UTC. The signed copy is attached.`,
    "",
    `The job: ${jobUrl}`,
  ].join("\n");
  const html = emailLayout(
    subject,
    `<p>${escapeHtml(input.signerName)} accepted proposal ${escapeHtml(input.number)} for ${escapeHtml(input.customerName)}: ${escapeHtml(input.optionLabel)}, ${escapeHtml(formatMoney(input.totalCents))}.</p>
<p>Accepted ${escapeHtml(input.acceptedAt.toISOString().slice(0, 16).replace("T", " "))} UTC. The signed copy is attached.</p>
${button(jobUrl, "Open the job")}`,
  );
  return { subject, text, html };
}
