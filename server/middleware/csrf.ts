import { randomBytes, timingSafeEqual } from "node:crypto";
import type { Request, RequestHandler } from "express";
import { HttpError } from "../errors";

const SAFE = new Set(["GET", "HEAD", "OPTIONS"]);

/** Returns the session's CSRF token, creating one when the session has none. */
export function csrfToken(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = randomBytes(32).toString("base64url");
  return req.session.csrfToken;
}

function matches(expected: string | undefined, given: unknown): boolean {
  if (!expected || typeof given !== "string") return false;
  const a = Buffer.from(expected);
  const b = Buffer.from(given);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** State-changing routes that a signed-out visitor may call (they still need the token). */
const ANONYMOUS_WRITES = new Set(["/auth/login", "/auth/logout", "/auth/forgot", "/auth/reset"]);

/**
 * Synchronizer-token CSRF check for every state-changing request that reaches it. Routes that
 * carry no session (the homeowner's token routes, the payment webhook) are mounted before it.
 * A request without a valid token is always refused; a signed-out one on a route that needs a
 * session is told 401 (sign in) rather than 403, as every other signed-out request is.
 */
export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (SAFE.has(req.method)) return next();
  if (!matches(req.session?.csrfToken, req.get("x-csrf-token"))) {
    if (!req.isAuthenticated() && !ANONYMOUS_WRITES.has(req.path)) return next(new HttpError(401, "unauthorized", "Please sign in"));
    return next(new HttpError(403, "csrf", "Missing or stale security token; reload the page and try again"));
  }
  next();
};
