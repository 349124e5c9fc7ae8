import type { RequestHandler } from "express";
import type { Role } from "../../shared/auth/roles";
import { forbidden, unauthorized } from "../errors";

export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!req.isAuthenticated() || !req.user) return next(unauthorized());
  next();
};

/** 401 when signed out, 403 when the role is not listed. */
export const requireRole =
  (...roles: Role[]): RequestHandler =>
  (req, _res, next) => {
    if (!req.isAuthenticated() || !req.user) return next(unauthorized());
    if (!roles.includes(req.user.role)) return next(forbidden());
    next();
  };
