import type { Sequelize, Transaction } from "sequelize";

/**
 * A DATETIME column as the API's ISO 8601 text, formatted by the database: the columns hold UTC (the connection's
 * time zone is +00:00) to the second, so this is exactly `Date#toISOString()` without a Date made per value.
 */
export const isoText = (column: string) => `DATE_FORMAT(${column}, '%Y-%m-%dT%H:%i:%s.000Z')`;

/** A DATETIME value as Sequelize writes one (UTC, to the millisecond; the column keeps what its precision holds). */
export const sqlDateTime = (d: Date) => d.toISOString().slice(0, 23).replace("T", " ");

/** The MariaDB driver's answer to a write. */
export interface WriteResult {
  affectedRows: number;
  insertId: number | bigint;
  warningStatus: number;
}

interface DriverConnection {
  execute(sql: string, values?: readonly unknown[]): Promise<unknown>;
}

interface TransactionInternals {
  connection?: DriverConnection;
  finished?: string;
  id?: string;
  rollback(): Promise<void>;
}

interface DialectQuery {
  formatError(err: unknown, stack?: string): Error;
}

const ER_DEADLOCK = 1213;

/**
 * Runs one statement inside `transaction` with MariaDB's binary protocol (`connection.execute` on the
 * transaction's own connection: the driver prepares the statement once per connection and keeps it, and the
 * values travel as typed binary values instead of being escaped into the SQL text). For statements that carry
 * large values, such as a roof's JSON document and takeoff, where escaping them into SQL text costs several
 * times the CPU, and for the few statements of a hot path.
 *
 * It behaves as `sequelize.query` in a transaction does: a finished transaction is refused, a driver error
 * becomes the same Sequelize error (the dialect's own conversion: UniqueConstraintError, ForeignKeyConstraintError,
 * DatabaseError…, so the error handler answers 409 or 503 as for any other statement), a deadlock rolls the
 * transaction back, and `DB_LOG_SQL=1` logs it. A write answers `WriteResult`, a SELECT its rows (JSON columns
 * and JSON expressions already parsed by the driver).
 */
export async function executeBinary<T = WriteResult>(sequelize: Sequelize, transaction: Transaction, sql: string, values: readonly unknown[]): Promise<T> {
  const t = transaction as unknown as TransactionInternals;
  if (t.finished) {
    throw new Error(`${t.finished} has been called on this transaction(${t.id}), you can no longer use it`);
  }
  const connection = t.connection;
  if (!connection) throw new Error("executeBinary needs a transaction that holds a connection");
  const log = (sequelize as unknown as { options: { logging?: unknown } }).options.logging as ((sql: string, ms: number) => void) | false | undefined;
  const started = typeof log === "function" ? Date.now() : 0;
  const errForStack = new Error();
  try {
    return (await connection.execute(sql, values)) as T;
  } catch (err) {
    if ((err as { errno?: number }).errno === ER_DEADLOCK) {
      try {
        await t.rollback();
      } catch {
        // the connection may be gone already; the transaction is over either way
      }
      t.finished = "rollback";
    }
    (err as { sql?: string }).sql = sql;
    const { Query } = (sequelize as unknown as { dialect: { Query: new (c: unknown, s: Sequelize, o: object) => DialectQuery } }).dialect;
    throw new Query(connection, sequelize, { transaction }).formatError(err, errForStack.stack);
  } finally {
    if (typeof log === "function") log(`Executed (binary protocol): ${sql}`, Date.now() - started);
  }
}
