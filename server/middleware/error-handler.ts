import type { ErrorRequestHandler } from "express";
import multer from "multer";
import { ZodError } from "zod";
import {
  ConnectionError,
  ForeignKeyConstraintError,
  TimeoutError,
  UniqueConstraintError,
  ValidationError,
  DatabaseError,
} from "sequelize";
import { HttpError, badRequest } from "../errors";
import type { Logger } from "../logger";
import { isLockConflict } from "../db/lock-conflict";

/** Turns a zod error into the `{ path: message }` map the forms show beside their fields. */
export function zodFields(err: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const i of err.issues) {
    const key = i.path.map(String).join(".") || "body";
    if (!(key in fields)) fields[key] = i.message;
  }
  return fields;
}

const DB_DOWN_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "ER_GET_CONNECTION_TIMEOUT"]);

function isDbDown(err: unknown): boolean {
  if (err instanceof ConnectionError || err instanceof TimeoutError) return true;
  const e = err as { code?: string; original?: { code?: string }; parent?: { code?: string }; fatal?: boolean };
  const code = e?.original?.code ?? e?.parent?.code ?? e?.code;
  if (code && DB_DOWN_CODES.has(code)) return true;
  if (err instanceof DatabaseError && /connection|socket|pool/i.test(err.message)) return true;
  return false;
}

export function toHttpError(err: unknown): HttpError {
  if (err instanceof HttpError) return err;
  if (err instanceof ZodError) return badRequest("Please check the highlighted fields", zodFields(err));
  if (err instanceof multer.MulterError) {
    const tooBig = ["LIMIT_FILE_SIZE", "LIMIT_FILE_COUNT"].includes(err.code);
    return new HttpError(tooBig ? 413 : 400, "upload", err.message);
  }
  if (err instanceof UniqueConstraintError) return new HttpError(409, "conflict", "That already exists");
  if (err instanceof ForeignKeyConstraintError)
    return new HttpError(409, "conflict", "A related record is missing or in use");
  if (err instanceof ValidationError) return badRequest(err.errors[0]?.message ?? "Invalid data");
  if (isDbDown(err)) return new HttpError(503, "unavailable", "The database is not answering; try again shortly");
  if (isLockConflict(err))
    return new HttpError(409, "write_conflict", "Another change was being saved at the same moment; nothing was saved, please try again");
  const e = err as { status?: number; statusCode?: number; expose?: boolean; type?: string; message?: string };
  const status = e?.status ?? e?.statusCode;
  if (status && status >= 400 && status < 500 && e.expose) {
    if (status === 413) return new HttpError(413, "too_large", "The request body is too large");
    if (e.type === "entity.parse.failed") return new HttpError(400, "bad_json", "The request body is not valid JSON");
    return new HttpError(status, "bad_request", e.message ?? "Bad request");
  }
  return new HttpError(500, "internal", "Something went wrong");
}

/** The path for the log without credentials: a link token (20+ URL-safe characters) becomes `:token`. */
export const redactPath = (p: string) => p.replace(/\/[A-Za-z0-9_-]{20,}(?=\/|$)/g, "/:token");

export const errorHandler =
  (logger: Logger): ErrorRequestHandler =>
  (err, req, res, next) => {
    if (res.headersSent) return next(err);
    const e = toHttpError(err);
    if (e.status >= 500) logger.error("request failed", { method: req.method, path: redactPath(req.originalUrl.split("?")[0] ?? ""), err });
    const body: Record<string, unknown> = { code: e.code, message: e.message };
    if (e.fields) body.fields = e.fields;
    res.status(e.status).json({ error: body, ...(e.extra ?? {}) });
  };
