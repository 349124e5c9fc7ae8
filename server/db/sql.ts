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

// ---- the MariaDB driver under Sequelize ------------------------------------------------------------------
// executeBinary and selectRows talk to the driver's connection directly for a few hot statements. They use
// Sequelize internals that its public types leave out (the transaction's connection, the pool, the dialect's
// error conversion); tests/server/roof-save-path.test.ts and select-rows.test.ts pin that behaviour.

interface DriverConnection {
  execute(sql: string, values?: readonly unknown[]): Promise<unknown>;
  query(cmd: { sql: string; typeCast?: undefined; rowsAsArray?: boolean }, values?: readonly unknown[]): Promise<unknown>;
}

interface TransactionInternals {
  connection?: DriverConnection;
  finished?: string;
  id?: string;
  rollback(): Promise<void>;
}

interface SequelizeInternals {
  connectionManager: {
    getConnection(options: { type: string }): Promise<DriverConnection>;
    releaseConnection(connection: DriverConnection): Promise<void> | void;
  };
  options: { logging?: unknown };
  dialect: { Query: new (c: unknown, s: Sequelize, o: object) => { formatError(err: unknown, stack?: string): Error } };
}

const internals = (sequelize: Sequelize) => sequelize as unknown as SequelizeInternals;

/** Sequelize's logger when `DB_LOG_SQL=1` (see ./sequelize.ts), else undefined. */
function sqlLogger(sequelize: Sequelize): ((sql: string, ms: number) => void) | undefined {
  const log = internals(sequelize).options.logging;
  return typeof log === "function" ? (log as (sql: string, ms: number) => void) : undefined;
}

/** A driver error as the Sequelize error `sequelize.query` would throw (UniqueConstraintError, DatabaseError…). */
function asSequelizeError(sequelize: Sequelize, connection: DriverConnection, err: unknown, sql: string, stack: string | undefined, transaction?: Transaction): Error {
  (err as { sql?: string }).sql = sql;
  return new (internals(sequelize).dialect.Query)(connection, sequelize, transaction ? { transaction } : {}).formatError(err, stack);
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
  const log = sqlLogger(sequelize);
  const started = log ? Date.now() : 0;
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
    throw asSequelizeError(sequelize, connection, err, sql, errForStack.stack, transaction);
  } finally {
    log?.(`Executed (binary protocol): ${sql}`, Date.now() - started);
  }
}

export interface SelectOptions {
  /** Each row as an array of its columns in SELECT order (the driver builds no object per row). */
  rowsAsArray?: boolean;
}

/**
 * A read outside any transaction, on one of Sequelize's pooled connections, straight through the MariaDB
 * driver: its `?` placeholders (values escaped by the driver), the text protocol, and the driver's own
 * decoding of the rows, without Sequelize's per-query work (a stack trace taken before every query, a copy of
 * every row) and without Sequelize's type-cast callback, which the driver otherwise calls for every value.
 * For the statements of hot read paths (the session, the jobs board); everything else uses Sequelize.
 *
 * Measured on the jobs board page (50 rows, 20 columns): Sequelize 0.75 ms of the app's CPU a query, this
 * 0.25–0.3 ms. The binary protocol (`execute`, a prepared statement) was as cheap for the app and cheaper for
 * MariaDB one query at a time, but cost MariaDB about a third more CPU with 20 requests at once, so it is
 * not used here.
 *
 * What comes back is the driver's array of rows (it also carries the columns' definitions as `meta`) and its
 * decoding: integers as numbers (BIGINT as a number when it fits, e.g.
 * COUNT(*)), DECIMAL as a string, DATETIME as a Date (slow to decode: format it in SQL, see `isoText`), TEXT
 * and VARCHAR as strings.
 *
 * It behaves as `sequelize.query` does for a SELECT: the connection comes from and goes back to Sequelize's pool
 * (validated there), a driver error becomes the same Sequelize error (so the error handler answers 503 when the
 * database is away), and `DB_LOG_SQL=1` logs the statement.
 */
export async function selectRows<T>(sequelize: Sequelize, sql: string, values: readonly unknown[], options: SelectOptions = {}): Promise<T[]> {
  const { connectionManager } = internals(sequelize);
  const log = sqlLogger(sequelize);
  const started = log ? Date.now() : 0;
  const connection = await connectionManager.getConnection({ type: "SELECT" });
  try {
    return (await connection.query({ sql, typeCast: undefined, rowsAsArray: options.rowsAsArray === true }, values)) as T[];
  } catch (err) {
    throw asSequelizeError(sequelize, connection, err, sql, (err as Error)?.stack);
  } finally {
    await connectionManager.releaseConnection(connection);
    log?.(`Executed (driver): ${sql} ${JSON.stringify(values, (_k, v: unknown) => (typeof v === "bigint" ? String(v) : v))}`, Date.now() - started);
  }
}
