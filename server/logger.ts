/** A small leveled logger; secrets never go through it (request bodies are not logged). */
export interface Logger {
  debug(msg: string, meta?: Record<string, unknown>): void;
  info(msg: string, meta?: Record<string, unknown>): void;
  warn(msg: string, meta?: Record<string, unknown>): void;
  error(msg: string, meta?: Record<string, unknown>): void;
}

const LEVELS = { debug: 10, info: 20, warn: 30, error: 40, silent: 100 } as const;
export type LogLevel = keyof typeof LEVELS;

function format(meta?: Record<string, unknown>): string {
  if (!meta) return "";
  const parts = Object.entries(meta).map(([k, v]) => {
    if (v instanceof Error) {
      // Sequelize's errors carry a stack taken before the query ran ("Error\n at Query.run…"), without the message.
      const head = `${v.name}: ${v.message}`;
      return `${k}=${v.stack?.startsWith(head) ? v.stack : `${head}${v.stack ? `\n${v.stack.split("\n").slice(1).join("\n")}` : ""}`}`;
    }
    return `${k}=${typeof v === "string" ? v : JSON.stringify(v)}`;
  });
  return parts.length ? " " + parts.join(" ") : "";
}

export function createLogger(level: LogLevel = "info"): Logger {
  const min = LEVELS[level];
  const at = (l: Exclude<LogLevel, "silent">, out: (s: string) => void) => (msg: string, meta?: Record<string, unknown>) => {
    if (LEVELS[l] >= min) out(`${new Date().toISOString()} ${l.toUpperCase()} ${msg}${format(meta)}`);
  };
  return {
    debug: at("debug", console.log),
    info: at("info", console.log),
    warn: at("warn", console.warn),
    error: at("error", console.error),
  };
}
