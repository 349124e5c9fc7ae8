/**
 * An express-rate-limit `Store` on MariaDB (table `rate_limit_hits`), so every server process behind a
 * load balancer counts against the same limit. express-rate-limit ships only a per-process MemoryStore
 * and has no MariaDB/MySQL store of its own.
 *
 * - One row per limiter prefix and client key: `<prefix>:<key>` (keys longer than the column or not
 *   plain printable ASCII are stored as `<prefix>:sha256:<hex>`), the hit count and the end of its window.
 * - `increment` is one atomic `INSERT … ON DUPLICATE KEY UPDATE` that starts a new window when the old one
 *   has ended, then reads the row back in the same transaction (the row lock is held until the commit),
 *   so concurrent requests on any number of processes each see their own exact count.
 * - Windows are measured with the database's clock (`NOW(3)`), never a server's, so servers whose clocks
 *   disagree still share one window.
 * - Expired rows are deleted now and then by each store (an unref'd timer, stopped by `shutdown()`).
 */
import { createHash } from "node:crypto";
import type { Options, Store, ClientRateLimitInfo } from "express-rate-limit";
import { QueryTypes, Transaction, type Sequelize } from "sequelize";
import { retryOnLockConflict } from "../db/lock-conflict";
import type { Logger } from "../logger";
import { RATE_LIMIT_TABLE } from "../models/rate-limit-hit.model";

/** The column's length (VARCHAR(191)). */
const KEY_MAX = 191;
const PREFIX_RE = /^[a-z0-9][a-z0-9_-]{0,39}$/;
const PLAIN_RE = /^[\x20-\x7e]*$/;

export interface RateLimitStoreOptions {
  sequelize: Sequelize;
  /** Names the limiter (`login`, `forgot`…): each limiter needs its own, or their counts would mix. */
  prefix: string;
  /** How often expired rows are deleted (default 60 s; 0 = never). */
  cleanupIntervalMs?: number;
  logger?: Logger;
}

const live = new Map<Sequelize, Set<SequelizeRateLimitStore>>();

/** Stops the cleanup timers of every store made on this Sequelize (call before sequelize.close()). */
export function shutdownRateLimitStores(sequelize: Sequelize): void {
  for (const store of live.get(sequelize) ?? []) store.shutdown();
  live.delete(sequelize);
}

/** Rows changed by a raw statement (the driver's OK packet, wherever Sequelize put it). */
function affectedRows(result: unknown): number {
  for (const part of Array.isArray(result) ? result : [result]) {
    if (typeof part === "number") return part;
    const n = (part as { affectedRows?: number | bigint } | undefined)?.affectedRows;
    if (n !== undefined) return Number(n);
  }
  return 0;
}

const closedPool = (err: unknown) => /connection manager was closed/i.test(String((err as Error)?.message ?? err));

export class SequelizeRateLimitStore implements Store {
  /** Counts are shared by every process (tells express-rate-limit this is not a per-process store). */
  readonly localKeys = false;
  /** Prepended to every key (express-rate-limit's double-count check reads it). */
  readonly prefix: string;
  private windowMs = 60_000;
  private timer: NodeJS.Timeout | null = null;
  private readonly sequelize: Sequelize;
  private readonly cleanupIntervalMs: number;
  private readonly logger?: Logger;
  private readonly table: string;

  constructor(options: RateLimitStoreOptions) {
    if (!PREFIX_RE.test(options.prefix)) throw new Error(`rate-limit store: bad prefix ${JSON.stringify(options.prefix)}`);
    this.sequelize = options.sequelize;
    this.prefix = `${options.prefix}:`;
    this.cleanupIntervalMs = options.cleanupIntervalMs ?? 60_000;
    this.logger = options.logger;
    this.table = RATE_LIMIT_TABLE;
  }

  /** Called once by express-rate-limit with the limiter's options. */
  init(options: Pick<Options, "windowMs">): void {
    this.windowMs = Math.max(1, Math.trunc(options.windowMs));
    if (this.cleanupIntervalMs > 0 && !this.timer) {
      this.timer = setInterval(() => void this.cleanup(), this.cleanupIntervalMs);
      this.timer.unref();
      let set = live.get(this.sequelize);
      if (!set) live.set(this.sequelize, (set = new Set()));
      set.add(this);
    }
  }

  /** The row key for a client key: prefixed, and hashed when it would not fit or is not plain ASCII. */
  rowKey(key: string): string {
    const plain = this.prefix + key;
    if (plain.length <= KEY_MAX && PLAIN_RE.test(key)) return plain;
    return `${this.prefix}sha256:${createHash("sha256").update(key, "utf8").digest("hex")}`;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows = await this.sequelize.query<{ hits: number; reset_ms: string | number }>(
      `SELECT hits, UNIX_TIMESTAMP(reset_at) * 1000 AS reset_ms FROM ${this.table} WHERE \`key\` = ? AND reset_at > NOW(3)`,
      { replacements: [this.rowKey(key)], type: QueryTypes.SELECT },
    );
    return rows[0] ? this.info(rows[0]) : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const rowKey = this.rowKey(key);
    const windowUs = this.windowMs * 1000;
    return retryOnLockConflict(() =>
      this.sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, async (transaction) => {
        // MariaDB applies the assignments left to right: `hits` is decided while reset_at is still the old value.
        await this.sequelize.query(
          `INSERT INTO ${this.table} (\`key\`, hits, reset_at) VALUES (?, 1, NOW(3) + INTERVAL ? MICROSECOND)
           ON DUPLICATE KEY UPDATE
             hits = IF(reset_at <= NOW(3), 1, hits + 1),
             reset_at = IF(reset_at <= NOW(3), NOW(3) + INTERVAL ? MICROSECOND, reset_at)`,
          { replacements: [rowKey, windowUs, windowUs], transaction },
        );
        const rows = await this.sequelize.query<{ hits: number; reset_ms: string | number }>(
          `SELECT hits, UNIX_TIMESTAMP(reset_at) * 1000 AS reset_ms FROM ${this.table} WHERE \`key\` = ?`,
          { replacements: [rowKey], type: QueryTypes.SELECT, transaction },
        );
        if (!rows[0]) throw new Error("rate-limit store: the counter row vanished inside its own transaction");
        return this.info(rows[0]);
      }),
    );
  }

  /** Takes one hit back (express-rate-limit's skipSuccessfulRequests / skipFailedRequests); never below 0. */
  async decrement(key: string): Promise<void> {
    await retryOnLockConflict(() =>
      this.sequelize.query(`UPDATE ${this.table} SET hits = hits - 1 WHERE \`key\` = ? AND hits > 0 AND reset_at > NOW(3)`, {
        replacements: [this.rowKey(key)],
      }),
    );
  }

  async resetKey(key: string): Promise<void> {
    await retryOnLockConflict(() => this.sequelize.query(`DELETE FROM ${this.table} WHERE \`key\` = ?`, { replacements: [this.rowKey(key)] }));
  }

  /** Forgets every count of this limiter (not the other limiters'). */
  async resetAll(): Promise<void> {
    await this.sequelize.query(`DELETE FROM ${this.table} WHERE \`key\` LIKE ?`, { replacements: [`${this.likePrefix()}%`] });
  }

  /** Deletes this limiter's ended windows (at most 1000 rows a pass); returns how many. */
  async cleanup(): Promise<number> {
    try {
      const result = await this.sequelize.query(`DELETE FROM ${this.table} WHERE \`key\` LIKE ? AND reset_at <= NOW(3) LIMIT 1000`, {
        replacements: [`${this.likePrefix()}%`],
      });
      return affectedRows(result);
    } catch (err) {
      if (closedPool(err)) this.shutdown(); // the app's database was closed without shutdown()
      else this.logger?.warn("rate-limit cleanup failed", { prefix: this.prefix, err: (err as Error).message });
      return 0;
    }
  }

  shutdown(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    live.get(this.sequelize)?.delete(this);
  }

  private likePrefix(): string {
    return this.prefix.replace(/[\\%_]/g, "\\$&");
  }

  private info(row: { hits: number; reset_ms: string | number }): ClientRateLimitInfo {
    return { totalHits: Number(row.hits), resetTime: new Date(Math.round(Number(row.reset_ms))) };
  }
}

/** A store for one limiter, or undefined (express-rate-limit's per-process MemoryStore) without a database. */
export function sharedRateLimitStore(sequelize: Sequelize | undefined, prefix: string, logger?: Logger): SequelizeRateLimitStore | undefined {
  return sequelize ? new SequelizeRateLimitStore({ sequelize, prefix, logger }) : undefined;
}
