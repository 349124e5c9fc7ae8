import type { Request, RequestHandler } from "express";
import { HttpError, badRequest } from "../errors";

const WRITES = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** Whether the request carries body bytes (a `Content-Length: 0` POST carries none). */
export function hasBodyBytes(req: Request): boolean {
  if (req.headers["transfer-encoding"] !== undefined) return true;
  const len = req.headers["content-length"];
  return len !== undefined && Number(len) > 0;
}

export const JSON_ONLY_MESSAGE = "Send the body as JSON with Content-Type: application/json";

/**
 * The API reads JSON bodies (and multipart on its upload routes, which check their own fields): a
 * state-changing request with any other body (text, a form, XML, no type at all) is refused with 415
 * before any route runs, so such a body is never mistaken for an empty one.
 */
export const jsonBodyOnly: RequestHandler = (req, _res, next) => {
  if (!WRITES.has(req.method) || !hasBodyBytes(req)) return next();
  if (req.is(["application/json", "multipart/form-data"])) return next();
  next(new HttpError(415, "unsupported_media_type", JSON_ONLY_MESSAGE));
};

/**
 * The body of a route whose fields are all optional: `{}` when none was sent, and a 400 when body bytes
 * came that no JSON parser read (multipart on a JSON route), rather than acting as if nothing was sent.
 */
export function optionalBody(req: Request): unknown {
  if (req.body === undefined && hasBodyBytes(req)) throw badRequest(JSON_ONLY_MESSAGE);
  return req.body ?? {};
}
