/**
 * MariaDB's lock conflicts: a deadlock (ER_LOCK_DEADLOCK, 1213) or a lock wait timeout (ER_LOCK_WAIT_TIMEOUT,
 * 1205). The server has rolled the statement (for a deadlock, the whole transaction) back, and its own message
 * says what to do: "try restarting transaction".
 */
export function isLockConflict(err: unknown): boolean {
  const e = err as { errno?: number; parent?: { errno?: number }; original?: { errno?: number } };
  const errno = e?.parent?.errno ?? e?.original?.errno ?? e?.errno;
  return errno === 1213 || errno === 1205;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Runs `fn` (a statement, or a whole `sequelize.transaction`) again when it ends in a lock conflict, up to
 * `attempts` times in all, after a short random pause that grows each time; any other error, or the last
 * conflict, is thrown. `fn` must be safe to run again: a transaction that was rolled back, or a statement whose
 * WHERE clause makes a second run change nothing more.
 */
export async function retryOnLockConflict<T>(fn: () => Promise<T>, attempts = 5): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await fn();
    } catch (err) {
      if (attempt >= attempts || !isLockConflict(err)) throw err;
      await sleep(5 * attempt + Math.random() * 10);
    }
  }
}
