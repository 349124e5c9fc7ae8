/**
 * The one module that talks to the API. Every request goes to `/api${path}` on the same origin
 * with the session cookie; every state-changing request carries the session's CSRF token.
 */

export type FieldErrors = Record<string, string>;

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldErrors,
    /** What the server sent beside `error`, such as `currentVersion` or `currentStatus` on a 409. */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = "ApiError";
  }
}

export type ApiOptions = {
  method?: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  /** Sent as a JSON body. */
  json?: unknown;
  signal?: AbortSignal;
};

const UNSAFE_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);
/** The server replaces the session at these routes, and with it the session's CSRF token. */
const SESSION_BOUNDARIES = new Set(["/auth/login", "/auth/logout"]);

let csrfToken: string | null = null;
let csrfRequest: Promise<string> | null = null;

/** Forgets the cached CSRF token; the next state-changing request fetches a new one. */
export function resetCsrfToken(): void {
  csrfToken = null;
  csrfRequest = null;
}

/** The session's CSRF token (fetched once, then cached); `uploadFiles` sends it too. */
export async function getCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  // one request even when several mutations start together
  csrfRequest ??= (async () => {
    const res = await send("/auth/csrf", { method: "GET" });
    if (!res.ok) throw await toApiError(res);
    const body = (await res.json()) as { token?: unknown };
    if (typeof body.token !== "string" || !body.token) {
      throw new ApiError(res.status, "csrf", "The server sent no security token. Reload the page and try again.");
    }
    csrfToken = body.token;
    return body.token;
  })().finally(() => {
    csrfRequest = null;
  });
  return csrfRequest;
}

async function send(path: string, { method = "GET", json, signal }: ApiOptions, token?: string): Promise<Response> {
  const headers: Record<string, string> = { Accept: "application/json" };
  if (json !== undefined) headers["Content-Type"] = "application/json";
  if (token) headers["X-CSRF-Token"] = token;
  try {
    return await fetch(`/api${path}`, {
      method,
      headers,
      body: json === undefined ? undefined : JSON.stringify(json),
      credentials: "same-origin",
      signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    if (signal?.aborted) throw err;
    throw new ApiError(0, "network", "Can't reach the server. Check your connection and try again.");
  }
}

async function toApiError(res: Response): Promise<ApiError> {
  let body: unknown = null;
  try {
    body = await res.json();
  } catch {
    // not JSON (a proxy page, an empty body): fall through to a generic message
  }
  return apiErrorFrom(res.status, body);
}

/** The ApiError for a non-2xx answer from its status and parsed body (null when it was not JSON). */
export function apiErrorFrom(status: number, body: unknown): ApiError {
  const res = { status };
  const err = (body as { error?: { code?: unknown; message?: unknown; fields?: unknown } } | null)?.error;
  if (err && typeof err === "object") {
    const fields =
      err.fields && typeof err.fields === "object" && !Array.isArray(err.fields)
        ? (Object.fromEntries(
            Object.entries(err.fields as Record<string, unknown>).map(([k, v]) => [k, String(v)]),
          ) as FieldErrors)
        : undefined;
    const { error: _error, ...details } = body as Record<string, unknown>;
    return new ApiError(
      res.status,
      typeof err.code === "string" ? err.code : codeForStatus(res.status),
      typeof err.message === "string" && err.message ? err.message : messageForStatus(res.status),
      fields,
      details,
    );
  }
  return new ApiError(res.status, codeForStatus(res.status), messageForStatus(res.status));
}

function codeForStatus(status: number): string {
  if (status === 401) return "unauthorized";
  if (status === 403) return "forbidden";
  if (status === 404) return "not_found";
  if (status === 409) return "conflict";
  if (status === 429) return "rate_limited";
  if (status >= 500) return "server_error";
  return "http_error";
}

function messageForStatus(status: number): string {
  if (status === 401) return "Please sign in.";
  if (status === 403) return "You don't have access to this.";
  if (status === 404) return "Not found.";
  if (status === 429) return "Too many attempts. Wait a few minutes and try again.";
  if (status >= 500) return "The server had a problem. Try again shortly.";
  return `The request failed (${status}).`;
}

export const isCsrfRefusal = (e: ApiError) => e.status === 403 && e.code.toLowerCase().includes("csrf");

/**
 * Calls the API and returns the parsed JSON body (`undefined` for 204).
 * Throws `ApiError` for any non-2xx answer and for network failures (status 0, code "network").
 */
export async function api<T>(path: string, options: ApiOptions = {}): Promise<T> {
  const method = options.method ?? "GET";
  const unsafe = UNSAFE_METHODS.has(method);
  let res = await send(path, options, unsafe ? await getCsrfToken() : undefined);

  if (unsafe && res.status === 403) {
    const err = await toApiError(res);
    if (!isCsrfRefusal(err)) throw err;
    // the session (and its token) changed under us: fetch a fresh token and retry once
    resetCsrfToken();
    res = await send(path, options, await getCsrfToken());
  }
  if (SESSION_BOUNDARIES.has(path)) resetCsrfToken();

  if (!res.ok) throw await toApiError(res);
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

/** `?a=1&b=x` from the defined, non-empty values (in a fixed order, so the URL is stable). */
export function toSearch(params: Record<string, string | number | boolean | undefined | null>): string {
  const s = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) {
    if (v === undefined || v === null || v === "") continue;
    s.set(k, String(v));
  }
  const out = s.toString();
  return out ? `?${out}` : "";
}

/** A message fit for a toast or a form banner. */
export function errorMessage(err: unknown): string {
  if (err instanceof ApiError) return err.message;
  return "Something went wrong. Try again.";
}
