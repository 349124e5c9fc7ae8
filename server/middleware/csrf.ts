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

/**
 * Synchronizer-token CSRF check for every state-changing request that reaches it. Routes that
 * carry no session (the homeowner's token routes, the payment webhook) are mounted before it.
 */
export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (SAFE.has(req.method)) return next();
  if (!matches(req.session?.csrfToken, req.get("x-csrf-token"))) {
    return next(new HttpError(403, "csrf", "Missing or stale security token; reload the page and try again"));
  }
  next();
};
