import type { RequestHandler } from "express";
import { HttpError } from "../errors";

export const notFoundHandler: RequestHandler = (req, _res, next) =>
  next(new HttpError(404, "not_found", `No API route for ${req.method} ${req.baseUrl}${req.path}`));
