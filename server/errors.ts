export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (msg: string, fields?: Record<string, string>) => new HttpError(400, "bad_request", msg, fields);
export const unauthorized = (msg = "Please sign in") => new HttpError(401, "unauthorized", msg);
export const forbidden = (msg = "You don't have access to this") => new HttpError(403, "forbidden", msg);
export const notFound = (what = "Resource") => new HttpError(404, "not_found", `${what} not found`);
export const conflict = (code: string, msg: string, extra?: Record<string, unknown>) =>
  new HttpError(409, code, msg, undefined, extra);
