/** A small browser-like HTTP client for the drills: keeps the session cookie and the CSRF token. */
export interface Answer<T = any> {
  status: number;
  body: T;
  ms: number;
}

/** fetch's error when the server closed the (reused, idle) connection before answering. */
function staleConnection(err: unknown): boolean {
  const cause = (err as { cause?: { code?: string; message?: string } })?.cause;
  return cause?.code === "UND_ERR_SOCKET" && /other side closed/.test(cause.message ?? "");
}

export class Client {
  private cookie = "";
  private token = "";

  constructor(readonly baseUrl: string) {}

  async request<T = any>(method: string, path: string, body?: unknown, timeoutMs = 60_000): Promise<Answer<T>> {
    const t0 = Date.now();
    const headers: Record<string, string> = { accept: "application/json" };
    if (this.cookie) headers.cookie = this.cookie;
    if (method !== "GET") headers["x-csrf-token"] = this.token;
    if (body !== undefined) headers["content-type"] = "application/json";
    const send = () =>
      fetch(this.baseUrl + path, {
        method,
        headers,
        body: body === undefined ? undefined : JSON.stringify(body),
        signal: AbortSignal.timeout(timeoutMs),
      });
    let res: Response;
    try {
      res = await send();
    } catch (err) {
      // A kept-alive connection the server closed for idleness (after 5 s) just as this request went out on it:
      // as a browser does, an idempotent request is sent once more on a new connection. Anything else fails.
      if (!(method === "GET" && staleConnection(err))) throw err;
      res = await send();
    }
    const set = res.headers.getSetCookie();
    if (set.length) this.cookie = set.map((c) => c.split(";")[0]).join("; ");
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      // not JSON: keep the text
    }
    return { status: res.status, body: parsed as T, ms: Date.now() - t0 };
  }

  get = <T = any>(path: string, timeoutMs?: number) => this.request<T>("GET", path, undefined, timeoutMs);
  post = <T = any>(path: string, body?: unknown) => this.request<T>("POST", path, body ?? {});
  put = <T = any>(path: string, body: unknown) => this.request<T>("PUT", path, body);

  /** Uses a CSRF token read elsewhere (e.g. from an /api/auth/csrf answer the caller checked itself). */
  setToken(token: string): void {
    this.token = token;
  }

  async refreshToken(): Promise<void> {
    const r = await this.get<{ token: string }>("/api/auth/csrf");
    if (r.status !== 200) throw new Error(`csrf: ${r.status} ${JSON.stringify(r.body)}`);
    this.token = r.body.token;
  }

  /** Signs in through the real login route (a fresh CSRF token before and after, as the client does). */
  async signIn(email: string, password: string): Promise<this> {
    await this.refreshToken();
    const r = await this.post("/api/auth/login", { email, password });
    if (r.status !== 200) throw new Error(`sign-in: ${r.status} ${JSON.stringify(r.body)}`);
    await this.refreshToken();
    return this;
  }
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Polls until `check` returns a value (not undefined) or the time is up. */
export async function waitUntil<T>(check: () => Promise<T | undefined>, timeoutMs: number, what: string, everyMs = 200): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await check().catch(() => undefined);
    if (v !== undefined) return v;
    if (Date.now() > deadline) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await sleep(everyMs);
  }
}
