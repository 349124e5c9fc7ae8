import { Router, type NextFunction, type Request, type Response } from "express";
import { z } from "zod";
import type { AppContext } from "../app";
import { isCaughtMessageId, type CaughtMessage } from "../mail/caught-message";
import { requireRole } from "../middleware/require-auth";
import { notFound } from "../errors";

/**
 * Which caught e-mails a user may read: only those the outbox tagged with the user's company; a password
 * reset e-mail only for owners (who can set any team member's password anyway) or its own recipient,
 * so an estimator cannot take over the owner's account through the catcher.
 */
export function canSeeCaughtMessage(m: CaughtMessage, user: Express.User): boolean {
  if (m.companyId !== user.companyId) return false;
  if (m.kind === "password_reset" && user.role !== "owner") {
    const me = user.email.toLowerCase();
    return [...m.to, ...m.envelopeTo].some((a) => a.toLowerCase() === me);
  }
  return true;
}

export const presentCaughtMessage = (m: CaughtMessage) => ({
  id: m.id,
  from: m.from,
  to: m.to,
  cc: m.cc,
  subject: m.subject,
  text: m.text,
  html: m.html,
  date: m.date,
  kind: m.kind,
  attachments: m.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.size })),
});

/** A file name safe for a Content-Disposition header (the header encoding itself is Express's). */
const safeFilename = (name: string) => name.replace(/[\u0000-\u001f\u007f\\/]/g, "_").slice(0, 200) || "attachment";

/**
 * `/api/dev/mail`: the local mail catcher's inbox, for owners and estimators. It exists only while the
 * catcher is in use (no SMTP_URL), whatever NODE_ENV is; otherwise every path here is a 404.
 */
export function devMailRouter(ctx: AppContext): Router {
  const router = Router();
  router.use((_req: Request, _res: Response, next: NextFunction) => {
    if (!ctx.mailCatcher || !ctx.config.mail.useCatcher) return next("router"); // → the API's 404
    next();
  });
  router.use(requireRole("owner", "estimator"));

  const find = (req: Request<{ id: string }>) => {
    const id = req.params.id;
    const msg = isCaughtMessageId(id) ? ctx.mailCatcher!.get(id) : undefined;
    if (!msg || !canSeeCaughtMessage(msg, req.user!)) throw notFound("E-mail");
    return msg;
  };

  router.get("/", (req, res) => {
    const data = ctx.mailCatcher!.messages().filter((m) => canSeeCaughtMessage(m, req.user!));
    res.set("Cache-Control", "no-store").json({ data: data.map(presentCaughtMessage) });
  });

  router.get("/:id", (req, res) => {
    res.set("Cache-Control", "no-store").json({ data: presentCaughtMessage(find(req)) });
  });

  router.get("/:id/attachments/:index", async (req, res) => {
    const msg = find(req);
    const index = z.coerce.number().int().min(0).max(1000).safeParse(req.params.index);
    const att = index.success ? await ctx.mailCatcher!.attachment(msg.id, index.data) : undefined;
    if (!att) throw notFound("Attachment");
    res.attachment(safeFilename(att.filename)); // Content-Disposition: attachment; filename="…"; filename*=UTF-8''…
    res.set({
      "Content-Type": att.contentType,
      "Content-Length": String(att.content.length),
      "Cache-Control": "private, no-store",
      // Never run anything from a caught e-mail on the app's origin, even if opened directly.
      "Content-Security-Policy": "sandbox; default-src 'none'",
    });
    res.end(att.content);
  });

  return router;
}
