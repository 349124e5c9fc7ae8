/**
 * Demo quotes over the demo jobs (seedDemoJobs), in every state and consistent with each job's status:
 *
 * - estimating jobs: an approved quote with three spacer options and a second quote in review (manual line
 *   and discount); an owner's own quote approved by that owner with a reason (an override) and a draft with
 *   two options; a quote in review and one the owner returned with a comment that the estimator then edited;
 * - proposed jobs: a quote sent to the homeowner, and one whose sent revision 1 was revised into an
 *   approved revision 2 (ready to send again; revision 1's link is still live until then);
 * - won, scheduled and installed jobs: accepted quotes (one with two options);
 * - lost jobs: one declined, one expired.
 *
 * Quotes are made through the quotes service (takeoffs by the engine, prices from the company's price book,
 * approvals and audit rows as in the app). Sent, accepted, declined and expired quotes get the proposal
 * record the homeowner's link would have made (sent, viewed, signed or declined times; a paid deposit on
 * scheduled and installed jobs); their links are never usable: the token is thrown away, only a random hash
 * is stored. Times are moved back to sit before each job's last change, so the approvals queue has an order.
 */
import type { Sequelize, Transaction } from "sequelize";
import type { OptionSpec, QuoteStatus } from "../../../shared/schemas/quote";
import { randomBytes } from "node:crypto";
import { Customer, Job, Payment, Proposal, Quote, QuoteOption } from "../../models/index";
import { QuotesService } from "../../services/quotes.service";
import type { DemoUser } from "./demo-jobs";

type Actor = Express.User;

const SPACER_OPTIONS: Array<{ label: string; spec: OptionSpec }> = [
  { label: "Battens + foil", spec: { spacer: "battens", foil: true } },
  { label: "Mesh + foil", spec: { spacer: "mesh", foil: true } },
  { label: "No spacer", spec: { spacer: "none", foil: false } },
];

const HOUR = 3_600_000;

/** Seeds the demo quotes for one company; false when it already has quotes or has no demo jobs. */
export async function seedDemoQuotes(sequelize: Sequelize, companyId: number, users: DemoUser[], transaction: Transaction): Promise<boolean> {
  const t = transaction;
  if ((await Quote.count({ where: { companyId }, transaction: t })) > 0) return false;
  const actor = (u: DemoUser | undefined): Actor | null => (u ? { id: u.id, email: u.email, name: u.name, role: u.role, companyId } : null);
  const owner = actor(users.find((u) => u.role === "owner"));
  const estimator = actor(users.find((u) => u.role === "estimator")) ?? owner;
  if (!owner || !estimator) return false;
  const svc = new QuotesService(sequelize);

  const jobs = await Job.findAll({ where: { companyId }, order: [["id", "ASC"]], transaction: t });
  const withRoof = new Set(
    ((await sequelize.query("SELECT job_id AS id FROM roofs WHERE company_id = ?", { replacements: [companyId], transaction: t }))[0] as Array<{ id: number }>).map(
      (r) => Number(r.id),
    ),
  );
  const byStatus = (status: string) => jobs.filter((j) => j.status === status && withRoof.has(j.id));
  const writer = (job: Job) => (job.estimatorId === owner.id ? owner : estimator);
  if (jobs.length === 0) return false;

  /** Moves a quote's times back: created `h` hours before the job's last change, each step an hour later. */
  const backdate = async (quoteId: number, job: Job, h: number) => {
    const base = new Date(job.updatedAt.getTime() - h * HOUR);
    const at = (k: number) => new Date(base.getTime() + k * HOUR);
    await sequelize.query("UPDATE quotes SET created_at = ?, updated_at = ? WHERE id = ?", { replacements: [at(0), at(4), quoteId], transaction: t });
    await sequelize.query(
      `UPDATE quote_revisions SET
         created_at = ?, updated_at = ?,
         submitted_at = CASE WHEN submitted_at IS NULL THEN NULL ELSE ? END,
         approved_at = CASE WHEN approved_at IS NULL THEN NULL ELSE ? END,
         returned_at = CASE WHEN returned_at IS NULL THEN NULL ELSE ? END,
         sent_at = CASE WHEN sent_at IS NULL THEN NULL ELSE ? END,
         decided_at = CASE WHEN decided_at IS NULL THEN NULL ELSE ? END
       WHERE quote_id = ?`,
      { replacements: [at(0), at(4), at(1), at(2), at(2), at(3), at(4), quoteId], transaction: t },
    );
  };

  const create = (job: Job, by: Actor, options = [SPACER_OPTIONS[0]], notes?: string) => svc.createIn(job.id, { options, notes }, by, t);
  const version = async (quoteId: number) => {
    const q = await Quote.findByPk(quoteId, { transaction: t });
    const [rows] = await sequelize.query("SELECT version FROM quote_revisions WHERE id = ?", { replacements: [q!.currentRevisionId], transaction: t });
    return Number((rows as Array<{ version: number }>)[0].version);
  };
  const submit = async (quoteId: number, by: Actor, notes?: string) => svc.submitIn(quoteId, { version: await version(quoteId), notes }, by, t);
  const approve = (quoteId: number, reason?: string) => svc.approveIn(quoteId, { reason }, owner, t);
  /** The proposal flow's states: only the revision's status and times (the proposals come later). */
  const setStatus = async (quoteId: number, status: QuoteStatus) => {
    const q = (await Quote.findByPk(quoteId, { transaction: t }))!;
    const decided = status === "accepted" || status === "declined" || status === "expired";
    await sequelize.query(`UPDATE quote_revisions SET status = ?, sent_at = NOW(), decided_at = ${decided ? "NOW()" : "NULL"} WHERE id = ?`, {
      replacements: [status, q.currentRevisionId],
      transaction: t,
    });
    await q.update({ status }, { transaction: t });
  };
  const approved = async (job: Job, options = [SPACER_OPTIONS[0]], reason?: string) => {
    const by = writer(job);
    const id = await create(job, by, options);
    await submit(id, by);
    await approve(id, reason);
    return id;
  };
  const optionIds = async (quoteId: number) => {
    const q = (await Quote.findByPk(quoteId, { transaction: t }))!;
    return (await QuoteOption.findAll({ where: { revisionId: q.currentRevisionId! }, order: [["position", "ASC"]], transaction: t })).map((o) => o.id);
  };

  /** Sent revisions that were revised afterwards: their proposal records are made with the others below. */
  const sentBeforeRevising: Array<{ quoteId: number; revisionId: number }> = [];
  const [estA, estB, estC] = byStatus("estimating");
  const [propA, propB] = byStatus("proposed");
  const accepted = [...byStatus("won"), ...byStatus("scheduled"), ...byStatus("installed")];
  const [lostA, lostB] = byStatus("lost");

  // ---- estimating -------------------------------------------------------------------------------------
  if (estA) {
    const q1 = await approved(estA, SPACER_OPTIONS);
    await backdate(q1, estA, 30);
    const q2 = await create(estA, writer(estA), [{ label: "Porch and house, mesh everywhere", spec: { spacer: "mesh", foil: false } }], "Alternative the homeowner asked about.");
    await svc.patchIn(
      q2,
      {
        version: 1,
        manualLines: [{ optionId: null, description: "Snow guards, clamp-on, over the entry", quantity: 12, unitPriceCents: 2600, unitCostCents: 1150, taxable: true }],
        discount: { amountCents: 15000, reason: "Booked with the spring list" },
      },
      writer(estA),
      t,
    );
    await submit(q2, writer(estA), "Snow guards added at the homeowner's request; small spring discount.");
    await backdate(q2, estA, 6);
  }
  if (estB) {
    const by = writer(estB);
    const q1 = await create(estB, by, [SPACER_OPTIONS[0], SPACER_OPTIONS[2]]);
    await svc.patchIn(
      q1,
      { version: 1, overrides: [{ optionId: null, key: "ice-barrier", quantity: 6, reason: "Extra course along the low wall on the windward side" }] },
      by,
      t,
    );
    await submit(q1, by);
    await approve(q1, "Windy site: the extra membrane is worth it");
    await backdate(q1, estB, 40);
    const q2 = await create(estB, by, [{ label: "Counter-battens + foil", spec: { spacer: "counter-battens", foil: true } }, SPACER_OPTIONS[1]], "Second look with a vented channel.");
    await backdate(q2, estB, 3);
  }
  if (estC) {
    const by = writer(estC);
    const q1 = await create(estC, by, [SPACER_OPTIONS[1], SPACER_OPTIONS[2]]);
    await submit(q1, by, "Workshop roof; the homeowner leans to the cheaper option.");
    await backdate(q1, estC, 10);
    const q2 = await create(estC, by, [SPACER_OPTIONS[2]]);
    await submit(q2, by);
    await svc.returnIn(q2, { comment: "Add the gutter apron at the workshop eaves and recheck the valley length." }, owner, t);
    await svc.patchIn(
      q2,
      {
        version: await version(q2),
        manualLines: [{ optionId: null, description: "Gutter apron at the workshop eaves, 10 ft pieces", quantity: 5, unitPriceCents: 3400, unitCostCents: 1900, taxable: true }],
      },
      by,
      t,
    );
    await backdate(q2, estC, 20);
  }

  // ---- proposed ---------------------------------------------------------------------------------------
  if (propA) {
    const q = await approved(propA, [SPACER_OPTIONS[2]]);
    await setStatus(q, "sent");
    await backdate(q, propA, 48);
  }
  if (propB) {
    const by = writer(propB);
    const q = await approved(propB, [SPACER_OPTIONS[1]]);
    await setStatus(q, "sent");
    // Revision 1 went to the homeowner: its link stays live (and is recorded below) until revision 2 is sent.
    sentBeforeRevising.push({ quoteId: q, revisionId: (await Quote.findByPk(q, { transaction: t }))!.currentRevisionId! });
    await svc.reviseIn(q, by, t);
    const [mesh] = await optionIds(q);
    await svc.patchIn(q, { version: 1, options: [{ id: mesh, label: "Mesh + foil", spec: SPACER_OPTIONS[1].spec }, SPACER_OPTIONS[2]] }, by, t);
    await submit(q, by, "Homeowner asked to see the no-spacer price beside the mesh.");
    await approve(q);
    await backdate(q, propB, 72);
  }

  // ---- won, scheduled, installed: accepted ------------------------------------------------------------------
  for (const [i, job] of accepted.entries()) {
    const q = await approved(job, i === 1 ? [SPACER_OPTIONS[0], SPACER_OPTIONS[1]] : [SPACER_OPTIONS[i % 3]]);
    await setStatus(q, "accepted");
    await backdate(q, job, 24 * 5);
  }

  // ---- lost: declined and expired -------------------------------------------------------------------------
  if (lostA) {
    const q = await approved(lostA, [SPACER_OPTIONS[2]]);
    await setStatus(q, "declined");
    await backdate(q, lostA, 24 * 4);
  }
  if (lostB) {
    const q = await approved(lostB, SPACER_OPTIONS.slice(0, 2));
    await setStatus(q, "expired");
    await backdate(q, lostB, 24 * 35);
  }
  // ---- the homeowners' side: proposal records for what was sent --------------------------------------------
  const DAY = 24 * HOUR;
  const signers = ["accepted", "declined", "expired", "sent"] as const;
  const sentQuotes = await Quote.findAll({ where: { companyId, status: [...signers] }, transaction: t });
  const sent: Array<{ q: Quote; revisionId: number }> = sentQuotes.map((q) => ({ q, revisionId: q.currentRevisionId! }));
  for (const r of sentBeforeRevising) sent.push({ q: (await Quote.findByPk(r.quoteId, { transaction: t }))!, revisionId: r.revisionId });
  for (const { q, revisionId } of sent) {
    const job = jobs.find((j) => j.id === q.jobId)!;
    const customer = await Customer.findByPk(job.customerId, { transaction: t });
    const options = await QuoteOption.findAll({ where: { revisionId }, order: [["position", "ASC"]], transaction: t });
    const sentAt = new Date(job.updatedAt.getTime() - 10 * DAY);
    const chosen = options[options.length > 1 ? 1 : 0];
    // A revised quote's earlier link is still live: the homeowner has not answered it.
    const status = q.status === "sent" || revisionId !== q.currentRevisionId ? "active" : (q.status as "accepted" | "declined" | "expired");
    const proposal = await Proposal.create(
      {
        companyId,
        quoteId: q.id,
        revisionId,
        jobId: job.id,
        tokenHash: randomBytes(32).toString("hex"), // no token exists for it: demo links cannot be opened
        status,
        expiresAt: new Date(sentAt.getTime() + (status === "expired" ? 30 : 60) * DAY),
        sentTo: customer?.email ?? "homeowner@example.com",
        sentBy: writer(job).id,
        viewedAt: new Date(sentAt.getTime() + 5 * HOUR),
        lastViewedAt: new Date(sentAt.getTime() + 26 * HOUR),
        ...(status === "accepted"
          ? { acceptedAt: new Date(sentAt.getTime() + 2 * DAY), acceptedOptionId: chosen.id, signerName: customer?.name ?? "Homeowner" }
          : {}),
        ...(status === "declined"
          ? { declinedAt: new Date(sentAt.getTime() + 3 * DAY), declineReason: "We have decided to wait until next spring." }
          : {}),
      },
      { transaction: t },
    );
    await sequelize.query("UPDATE proposals SET created_at = ?, updated_at = ? WHERE id = ?", {
      replacements: [sentAt, sentAt, proposal.id],
      transaction: t,
    });
    if (status === "accepted" && Number(chosen.depositCents) > 0 && job.status !== "won") {
      await Payment.create(
        {
          companyId,
          proposalId: proposal.id,
          jobId: job.id,
          amountCents: Number(chosen.depositCents),
          status: "paid",
          paidAt: new Date(sentAt.getTime() + 3 * DAY),
        },
        { transaction: t },
      );
    }
  }

  // The board's quote total follows each job's latest live quote or accepted option (after the times moved).
  for (const job of jobs) await svc.refreshJobTotal(job.id, t);
  return true;
}
