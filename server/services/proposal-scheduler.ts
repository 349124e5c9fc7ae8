/**
 * Time-driven proposal changes, run by every server process (startServer) once a minute by default:
 * - a live link past its expiry → expired (quote → expired, job → lost unless a newer revision exists);
 * - one reminder e-mail REMINDER_DAYS_BEFORE days before the expiry.
 *
 * Safe with several processes: each change is a conditional UPDATE (`… WHERE status = 'active' AND …`)
 * inside its own transaction, and only the process whose UPDATE changed the row goes on (the row lock
 * makes the second process wait, then find nothing to change). So each expiry and each reminder happens
 * once, with its e-mail and audit rows in the same transaction.
 */
import { Op, type Sequelize } from "sequelize";
import { formatDate } from "../../shared/schemas/proposal";
import type { Logger } from "../logger";
import { emailLayout, escapeHtml } from "../mail/templates";
import { Customer, Job, Proposal, Quote, QuoteRevision } from "../models/index";
import type { Storage } from "../storage/storage";
import { recordAudit } from "./audit.service";
import { JobsService } from "./jobs.service";
import { enqueueEmail } from "./outbox.service";
import { homeownerActor, readAll } from "./proposals.service";

const DAY_MS = 86_400_000;
const BATCH = 100;

export interface SchedulerContext {
  sequelize: Sequelize;
  storage: Storage;
  logger?: Logger;
  /** Days before expiry for the one reminder (default 3). */
  reminderDaysBefore?: number;
}

export interface SchedulerRunResult {
  expired: number;
  reminded: number;
}

/** One pass: expiries first (an expired proposal gets no reminder), then reminders. */
export async function runSchedulerOnce(ctx: SchedulerContext, now: Date = new Date()): Promise<SchedulerRunResult> {
  const result: SchedulerRunResult = { expired: 0, reminded: 0 };
  const due = await Proposal.findAll({
    where: { status: "active", expiresAt: { [Op.lte]: now } },
    attributes: ["id"],
    order: [["expiresAt", "ASC"]],
    limit: BATCH,
  });
  for (const { id } of due) {
    try {
      if (await expireOne(ctx, id, now)) result.expired += 1;
    } catch (err) {
      ctx.logger?.error("proposal expiry failed", { proposalId: id, err: (err as Error).message });
    }
  }
  const days = ctx.reminderDaysBefore ?? 3;
  if (days > 0) {
    const remind = await Proposal.findAll({
      where: { status: "active", reminderSentAt: null, expiresAt: { [Op.gt]: now, [Op.lte]: new Date(now.getTime() + days * DAY_MS) } },
      attributes: ["id"],
      order: [["expiresAt", "ASC"]],
      limit: BATCH,
    });
    for (const { id } of remind) {
      try {
        if (await remindOne(ctx, id, now)) result.reminded += 1;
      } catch (err) {
        ctx.logger?.error("proposal reminder failed", { proposalId: id, err: (err as Error).message });
      }
    }
  }
  return result;
}

/** Rows changed by the last statement of a raw UPDATE (MariaDB's OkPacket). */
function affected(result: unknown): number {
  for (const part of Array.isArray(result) ? result : [result]) {
    if (typeof part === "number") return part;
    const n = (part as { affectedRows?: number | bigint } | undefined)?.affectedRows;
    if (n !== undefined) return Number(n);
  }
  return 0;
}

async function expireOne(ctx: SchedulerContext, id: number, now: Date): Promise<boolean> {
  const jobs = new JobsService(ctx.sequelize);
  return ctx.sequelize.transaction(async (t) => {
    const meta = await ctx.sequelize.query(
      "UPDATE proposals SET status = 'expired', updated_at = ? WHERE id = ? AND status = 'active' AND expires_at <= ?",
      { replacements: [now, id, now], transaction: t },
    );
    if (affected(meta) !== 1) return false; // another process did it, or it was decided meanwhile
    const p = (await Proposal.findByPk(id, { transaction: t }))!;
    const job = await Job.findByPk(p.jobId, { transaction: t, lock: t.LOCK.UPDATE });
    const quote = await Quote.findByPk(p.quoteId, { transaction: t, lock: t.LOCK.UPDATE });
    const rev = await QuoteRevision.findByPk(p.revisionId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!job || !quote || !rev) return true;
    // The revision expires only if no other live link still offers it (a resend revokes the older ones).
    const live = await Proposal.count({ where: { revisionId: rev.id, status: "active" }, transaction: t });
    const current = quote.currentRevisionId === rev.id;
    if (rev.status === "sent" && live === 0) {
      await rev.update({ status: "expired", version: rev.version + 1, decidedAt: now }, { transaction: t });
      if (current) await quote.update({ status: "expired" }, { transaction: t });
      await recordAudit(
        {
          companyId: p.companyId,
          actorId: null,
          entityType: "quote",
          entityId: quote.id,
          jobId: job.id,
          action: "expired",
          changes: { number: quote.number, revisionNo: rev.revisionNo, proposalId: p.id, status: { from: "sent", to: "expired" } },
        },
        t,
      );
      if (current && job.status === "proposed") {
        await jobs.applyStatus(job, "lost", `proposal ${quote.number} expired`, homeownerActor(p.companyId), t);
      }
    }
    return true;
  });
}

async function remindOne(ctx: SchedulerContext, id: number, now: Date): Promise<boolean> {
  const p0 = await Proposal.findByPk(id);
  if (!p0) return false;
  // The PDF (which carries the private link: only its hash is stored) goes with the reminder.
  const pdf = p0.pdfKey ? await readAll(ctx.storage, p0.pdfKey).catch(() => null) : null;
  return ctx.sequelize.transaction(async (t) => {
    const meta = await ctx.sequelize.query(
      "UPDATE proposals SET reminder_sent_at = ?, updated_at = ? WHERE id = ? AND status = 'active' AND reminder_sent_at IS NULL AND expires_at > ?",
      { replacements: [now, now, id, now], transaction: t },
    );
    if (affected(meta) !== 1) return false;
    const p = (await Proposal.findByPk(id, { transaction: t }))!;
    const [quote, job] = await Promise.all([Quote.findByPk(p.quoteId, { transaction: t }), Job.findByPk(p.jobId, { transaction: t })]);
    const customer = job ? await Customer.findByPk(job.customerId, { transaction: t }) : null;
    const number = quote?.number ?? String(p.id);
    const until = formatDate(p.expiresAt.toISOString());
    const sentOn = formatDate(p.createdAt.toISOString());
    const subject = `Reminder: your roof proposal ${number} is valid until ${until}`;
    const name = customer?.name ?? "there";
    const text = [
      `Hello ${name},`,
      "",
      `A reminder that proposal ${number}, which we sent you on ${sentOn}, is valid until ${until}.`,
      "To choose an option and accept it, open the private link in that e-mail, or the link in the attached PDF.",
      "If you have questions or would like changes, just reply to this e-mail.",
    ].join("\n");
    const html = emailLayout(
      subject,
      `<p>Hello ${escapeHtml(name)},</p>
<p>A reminder that proposal ${escapeHtml(number)}, which we sent you on ${escapeHtml(sentOn)}, is valid until <strong>${escapeHtml(until)}</strong>.</p>
<p>To choose an option and accept it, open the private link in that e-mail, or the link in the attached PDF.</p>
<p>If you have questions or would like changes, just reply to this e-mail.</p>`,
    );
    await enqueueEmail(
      {
        to: p.sentTo,
        subject,
        text,
        html,
        attachments: pdf ? [{ filename: `proposal-${number}.pdf`.replace(/[^A-Za-z0-9._-]/g, "_"), contentType: "application/pdf", content: pdf }] : undefined,
      },
      { transaction: t, companyId: p.companyId, kind: "proposal_reminder" },
    );
    await recordAudit(
      { companyId: p.companyId, actorId: null, entityType: "quote", entityId: p.quoteId, jobId: p.jobId, action: "reminder_sent", changes: { number, proposalId: p.id, to: p.sentTo } },
      t,
    );
    return true;
  });
}

export interface ProposalScheduler {
  stop(): Promise<void>;
  /** The pass in progress, if any (tests). */
  readonly running: Promise<SchedulerRunResult> | null;
}

/** Runs a pass every `intervalMs` (never two at once in this process). */
export function startProposalScheduler(ctx: SchedulerContext, intervalMs: number): ProposalScheduler {
  let running: Promise<SchedulerRunResult> | null = null;
  let stopped = false;
  const tick = () => {
    if (stopped || running) return;
    running = runSchedulerOnce(ctx)
      .catch((err) => {
        ctx.logger?.error("proposal scheduler pass failed", { err: (err as Error).message });
        return { expired: 0, reminded: 0 };
      })
      .finally(() => {
        running = null;
      });
  };
  const timer = setInterval(tick, intervalMs);
  timer.unref();
  setTimeout(tick, 1_000).unref();
  return {
    get running() {
      return running;
    },
    async stop() {
      stopped = true;
      clearInterval(timer);
      if (running) await running;
    },
  };
}
