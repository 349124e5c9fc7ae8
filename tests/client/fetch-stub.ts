import { vi } from "vitest";

/** One request as the stubbed `fetch` saw it. */
export type RecordedCall = {
  method: string;
  path: string;
  headers: Record<string, string>;
  body: unknown;
  credentials?: RequestCredentials;
};

type Handler = (call: RecordedCall) => Response | Promise<Response>;

export const json = (status: number, body?: unknown) =>
  new Response(body === undefined ? null : JSON.stringify(body), {
    status,
    headers: body === undefined ? {} : { "Content-Type": "application/json" },
  });

/**
 * Replaces global `fetch` with a table of `"METHOD /path"` handlers (a handler may be a list:
 * each call takes the next one, the last repeats). A request with no handler fails the test,
 * like MSW's `onUnhandledRequest: "error"`.
 */
export function stubApi(routes: Record<string, Handler | Handler[]>) {
  const calls: RecordedCall[] = [];
  const unhandled: string[] = [];
  const counters = new Map<string, number>();

  const fetchStub = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(typeof input === "string" ? input : input instanceof URL ? input.href : input.url, "http://localhost");
    const method = (init.method ?? "GET").toUpperCase();
    const headers = Object.fromEntries(new Headers(init.headers).entries());
    const body = typeof init.body === "string" ? JSON.parse(init.body) : undefined;
    const call: RecordedCall = { method, path: url.pathname + url.search, headers, body, credentials: init.credentials };
    calls.push(call);
    const key = `${method} ${url.pathname}`;
    const entry = routes[key];
    if (!entry) {
      unhandled.push(key);
      throw new Error(`Unhandled request in test: ${key}`);
    }
    const n = counters.get(key) ?? 0;
    counters.set(key, n + 1);
    const handler = Array.isArray(entry) ? entry[Math.min(n, entry.length - 1)]! : entry;
    return handler(call);
  });

  vi.stubGlobal("fetch", fetchStub);
  return {
    calls,
    unhandled,
    /** Calls made to one `"METHOD /path"`. */
    callsTo: (key: string) => calls.filter((c) => `${c.method} ${c.path.split("?")[0]}` === key),
  };
}
