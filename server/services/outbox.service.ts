/**
 * The e-mail outbox. A change that must send an e-mail writes an `outbox_messages` row in its own
 * transaction (enqueueEmail), so the e-mail exists exactly when the change committed. An OutboxWorker in
 * each server process delivers due rows through the Mailer, with retries and exponential backoff.
 *
 * Delivery guarantees:
 * - A row is claimed (pending → sending, with claimed_by/claimed_at) in a short transaction with
 *   `SELECT … FOR UPDATE SKIP LOCKED`, so two workers (in one or several processes) never claim the same
 *   row; every later update of the row is guarded by `status = 'sending' AND claimed_by = <this worker>`.
 * - After the SMTP server accepts the message the row is marked `sent` and is never claimed again, so a
 *   restart does not resend it. A failure puts it back to `pending` with attempts + 1, last_error and a
 *   later next_attempt_at; after maxAttempts (or a permanent 5xx refusal of the envelope) it is `failed`.
 * - The one case that can send a message twice: the process dies (or loses the database) after the SMTP
 *   server accepted the message and before the row was marked sent. The row then stays `sending`;
 *   after `stuckAfterMs` (5 min by default, far above the mailer's timeouts) a worker puts it back to
 *   `pending` with a note in last_error, and it is sent again with the same Message-ID header (so mail
 *   clients that de-duplicate on it show it once). Nothing else can resend a row: a worker that finds
 *   its claim gone (the row was recovered meanwhile, which needs a send slower than stuckAfterMs) logs it.
 */
import { hostname } from "node:os";
import { randomBytes } from "node:crypto";
import { Op, QueryTypes, Transaction, type Sequelize } from "sequelize";
import { retryOnLockConflict } from "../db/lock-conflict";
import type { Logger } from "../logger";
import type { MailMessage, Mailer } from "../mail/mailer";
import { OutboxMessage } from "../models/mail.models";

/** Raw attachment bytes one e-mail may carry (stored as base64 in the row; MariaDB's packet limit is 16 MB). */
export const MAX_OUTBOX_ATTACHMENT_BYTES = 8 * 1024 * 1024;

export interface EnqueueOptions {
  /** The caller's transaction: the e-mail commits (or rolls back) with the change that causes it. */
  transaction: Transaction;
  companyId: number | null;
  /** What the e-mail is, e.g. "password_reset", "proposal". */
  kind: string;
  /** Earliest delivery time (default now). */
  notBefore?: Date;
}

const list = (v: string | string[] | undefined): string[] =>
  (Array.isArray(v) ? v : v ? [v] : []).map((s) => s.trim()).filter(Boolean);

/** Puts an e-mail in the outbox inside the caller's transaction; the worker sends it after the commit. */
export async function enqueueEmail(msg: MailMessage, options: EnqueueOptions): Promise<OutboxMessage> {
  const to = list(msg.to);
  if (to.length === 0) throw new Error("enqueueEmail: the message has no recipient");
  if (!/^[a-z0-9_.-]{1,40}$/i.test(options.kind)) throw new Error(`enqueueEmail: bad kind "${options.kind}"`);
  if (msg.subject.length > 500) throw new Error("enqueueEmail: the subject is longer than 500 characters");
  const bytes = (msg.attachments ?? []).reduce((n, a) => n + a.content.length, 0);
  if (bytes > MAX_OUTBOX_ATTACHMENT_BYTES) {
    throw new Error(`enqueueEmail: attachments total ${bytes} bytes, more than ${MAX_OUTBOX_ATTACHMENT_BYTES}`);
  }
  const cc = list(msg.cc);
  const bcc = list(msg.bcc);
  return OutboxMessage.create(
    {
      companyId: options.companyId,
      kind: options.kind,
      fromAddress: msg.from ?? null,
      toAddresses: to,
      cc: cc.length ? cc : null,
      bcc: bcc.length ? bcc : null,
      subject: msg.subject,
      text: msg.text,
      html: msg.html,
      headers: msg.headers && Object.keys(msg.headers).length ? msg.headers : null,
      attachments: msg.attachments?.length
        ? msg.attachments.map((a) => ({
            filename: a.filename,
            contentType: a.contentType,
            contentBase64: a.content.toString("base64"),
          }))
        : null,
      status: "pending",
      attempts: 0,
      nextAttemptAt: options.notBefore ?? new Date(),
    },
    { transaction: options.transaction },
  );
}

/** Delay before the next try after `attempts` failed tries: 10 s, 30 s, 2 min, 10 min, 1 h, 3 h, then 6 h. */
export function outboxBackoffMs(attempts: number): number {
  const steps = [10_000, 30_000, 120_000, 600_000, 3_600_000, 10_800_000, 21_600_000];
  return steps[Math.min(Math.max(attempts, 1), steps.length) - 1];
}

/** A permanent refusal: the server rejected the sender or every recipient with a 5xx reply. */
function isPermanent(err: unknown): boolean {
  const e = err as { code?: string; responseCode?: number };
  return e?.code === "EENVELOPE" && typeof e.responseCode === "number" && e.responseCode >= 500 && e.responseCode < 600;
}

function describe(err: unknown): string {
  const e = err as { message?: string; code?: string; responseCode?: number };
  const parts = [e?.code, e?.responseCode ? `SMTP ${e.responseCode}` : undefined, e?.message ?? String(err)];
  return parts.filter(Boolean).join(": ").slice(0, 2_000);
}

function domainOf(from: string): string {
  const m = /@([a-z0-9.-]+)>?\s*$/i.exec(from);
  return m ? m[1].toLowerCase() : "ridgewright.invalid";
}

export interface OutboxWorkerOptions {
  sequelize: Sequelize;
  mailer: Mailer;
  logger?: Logger;
  /** Sender when a message names none (config.mail.from). */
  from?: string;
  pollMs?: number;
  maxAttempts?: number;
  batchSize?: number;
  /** A row left in `sending` longer than this is taken as a crash mid-send and put back to pending. */
  stuckAfterMs?: number;
  /** Identifies this worker in claimed_by (default host:pid:random). */
  workerId?: string;
  /** Adds X-Ridgewright-Company / X-Ridgewright-Kind headers, which the local catcher uses to show each
   *  company its own e-mail. Only for the catcher: real recipients need not see them. */
  tagForCatcher?: boolean;
  backoffMs?: (attempts: number) => number;
}

export interface OutboxRunResult {
  claimed: number;
  sent: number;
  retried: number;
  failed: number;
  recovered: number;
}

/** A one-time link's secret part: a proposal link (`/p/<token>`) or a password-reset link (`?token=<token>`). */
const LINK_TOKEN = /(\/p\/|[?&](?:amp;)?token=)[A-Za-z0-9_-]{20,}/g;

/** The text with every one-time link token replaced, for the copy of an e-mail kept after it was delivered. */
export const withoutLinkTokens = (s: string): string => s.replace(LINK_TOKEN, "$1[removed after delivery]");

export class OutboxWorker {
  readonly id: string;
  private readonly pollMs: number;
  private readonly maxAttempts: number;
  private readonly batchSize: number;
  private readonly stuckAfterMs: number;
  private readonly from: string;
  private readonly backoffMs: (attempts: number) => number;
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<OutboxRunResult> | null = null;
  private stopped = true;

  constructor(private readonly options: OutboxWorkerOptions) {
    this.id = (options.workerId ?? `${hostname()}:${process.pid}:${randomBytes(3).toString("hex")}`).slice(0, 100);
    this.pollMs = options.pollMs ?? 1_500;
    this.maxAttempts = options.maxAttempts ?? 8;
    this.batchSize = options.batchSize ?? 10;
    this.stuckAfterMs = options.stuckAfterMs ?? 5 * 60_000;
    this.from = options.from ?? "Ridgewright <no-reply@example.com>";
    this.backoffMs = options.backoffMs ?? outboxBackoffMs;
  }

  /** Polls every pollMs until stop(); a full batch is followed at once by the next. */
  start(): void {
    if (!this.stopped) return;
    this.stopped = false;
    this.schedule(0);
  }

  /** Stops polling and waits for a delivery in progress to finish (its rows end sent or pending). */
  async stop(): Promise<void> {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    await this.running?.catch(() => {});
  }

  /** One pass: recover stuck rows, claim due rows, send them. Never runs twice at once in one worker. */
  runOnce(): Promise<OutboxRunResult> {
    this.running ??= this.pass().finally(() => {
      this.running = null;
    });
    return this.running;
  }

  private schedule(ms: number) {
    if (this.stopped) return;
    this.timer = setTimeout(() => {
      this.timer = null;
      this.runOnce().then(
        (r) => this.schedule(r.claimed >= this.batchSize ? 0 : this.pollMs),
        (err) => {
          this.options.logger?.warn("outbox pass failed; retrying", { err });
          this.schedule(this.pollMs);
        },
      );
    }, ms);
    this.timer.unref();
  }

  private async pass(): Promise<OutboxRunResult> {
    const result: OutboxRunResult = { claimed: 0, sent: 0, retried: 0, failed: 0, recovered: 0 };
    result.recovered = await this.recoverStuck();
    const ids = await this.claim();
    result.claimed = ids.length;
    if (!ids.length) return result;
    const rows = await OutboxMessage.findAll({
      where: { id: { [Op.in]: ids }, status: "sending", claimedBy: this.id },
      order: [["id", "ASC"]],
    });
    for (const row of rows) {
      const outcome = await this.deliver(row);
      result[outcome] += 1;
    }
    return result;
  }

  /** Puts rows left in `sending` by a crashed process back to pending (counted as an attempt). */
  private async recoverStuck(): Promise<number> {
    const now = new Date();
    const affected = await retryOnLockConflict(() =>
      this.options.sequelize.query(
        `UPDATE outbox_messages
            SET status = IF(attempts + 1 >= ?, 'failed', 'pending'),
                last_error = CONCAT('Left in sending by ', COALESCE(claimed_by, '?'), ' since ',
                                    DATE_FORMAT(claimed_at, '%Y-%m-%d %H:%i:%s'),
                                    ' UTC (the process stopped mid-send); it may have been delivered already'),
                attempts = attempts + 1,
                next_attempt_at = ?,
                claimed_by = NULL,
                claimed_at = NULL,
                updated_at = ?
          WHERE status = 'sending' AND claimed_at < ?`,
        {
          replacements: [this.maxAttempts, now, now, new Date(now.getTime() - this.stuckAfterMs)],
          type: QueryTypes.BULKUPDATE,
        },
      ),
    );
    if (affected) this.options.logger?.warn(`outbox: recovered ${affected} e-mail(s) stuck in sending`);
    return affected;
  }

  /**
   * Claims due rows for this worker; rows another worker has locked are skipped, not waited for. A deadlock with
   * another worker's writes rolls the claim back, and it is made again.
   */
  private async claim(): Promise<number[]> {
    const { sequelize } = this.options;
    return retryOnLockConflict(() =>
      sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, async (transaction) => {
        const now = new Date();
        const rows = await sequelize.query<{ id: number | string | bigint }>(
          `SELECT id FROM outbox_messages
            WHERE status = 'pending' AND next_attempt_at <= ?
            ORDER BY next_attempt_at, id
            LIMIT ?
            FOR UPDATE SKIP LOCKED`,
          { replacements: [now, this.batchSize], type: QueryTypes.SELECT, transaction },
        );
        const ids = rows.map((r) => Number(r.id));
        if (!ids.length) return [];
        await sequelize.query(
          `UPDATE outbox_messages SET status = 'sending', claimed_by = ?, claimed_at = ?, updated_at = ?
            WHERE id IN (?) AND status = 'pending'`,
          { replacements: [this.id, now, now, ids], transaction },
        );
        return ids;
      }),
    );
  }

  private toMail(row: OutboxMessage): MailMessage {
    const from = row.fromAddress ?? this.from;
    const headers: Record<string, string> = { ...(row.headers ?? {}) };
    if (this.options.tagForCatcher) {
      headers["X-Ridgewright-Kind"] = row.kind;
      if (row.companyId !== null) headers["X-Ridgewright-Company"] = String(row.companyId);
    }
    return {
      from,
      to: row.toAddresses,
      cc: row.cc ?? undefined,
      bcc: row.bcc ?? undefined,
      subject: row.subject,
      text: row.text,
      html: row.html,
      headers,
      // The same Message-ID on every try, so a resend after a crash is recognisably the same e-mail.
      messageId: `<outbox-${row.id}.${row.createdAt.getTime()}@${domainOf(from)}>`,
      attachments: (row.attachments ?? []).map((a) => ({
        filename: a.filename,
        contentType: a.contentType,
        content: Buffer.from(a.contentBase64, "base64"),
      })),
    };
  }

  private async deliver(row: OutboxMessage): Promise<"sent" | "retried" | "failed"> {
    const guard = { where: { id: row.id, status: "sending" as const, claimedBy: this.id } };
    let messageId: string;
    try {
      ({ messageId } = await this.options.mailer.send(this.toMail(row)));
    } catch (err) {
      const attempts = row.attempts + 1;
      const failed = isPermanent(err) || attempts >= this.maxAttempts;
      const now = Date.now();
      await retryOnLockConflict(() =>
        OutboxMessage.update(
          {
            status: failed ? "failed" : "pending",
            attempts,
            lastError: describe(err),
            nextAttemptAt: new Date(failed ? now : now + this.backoffMs(attempts)),
            claimedBy: null,
            claimedAt: null,
          },
          guard,
        ),
      );
      this.options.logger?.warn(`outbox: e-mail ${row.id} (${row.kind}) ${failed ? "failed" : "will be retried"}`, {
        attempts,
        error: describe(err),
      });
      return failed ? "failed" : "retried";
    }
    // The e-mail is gone: marking it sent must not fail on a lock conflict with another worker's claim (InnoDB
    // can pick this statement as a deadlock's victim), or the row would stay in sending and be sent again
    // once recovered. The guard makes a second run change nothing more.
    const sentAt = new Date();
    const [updated] = await retryOnLockConflict(() =>
      OutboxMessage.update(
        {
          status: "sent",
          attempts: row.attempts + 1,
          sentAt,
          messageId: messageId.slice(0, 255),
          // The sent copy keeps everything but the one-time links: only their hashes are stored elsewhere.
          text: withoutLinkTokens(row.text),
          html: withoutLinkTokens(row.html),
        },
        guard,
      ),
    );
    if (updated === 0) {
      this.options.logger?.warn(`outbox: e-mail ${row.id} was sent but its claim had been taken back (slow send)`);
    }
    return "sent";
  }
}
