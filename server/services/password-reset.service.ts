import { createHash, randomBytes } from "node:crypto";
import { Op, type Sequelize } from "sequelize";
import { HttpError } from "../errors";
import { hashPassword } from "../auth/password";
import { Session, User } from "../models/index";
import { PasswordResetToken } from "../models/mail.models";
import { passwordChangedEmail, passwordResetEmail } from "../mail/templates";
import { enqueueEmail } from "./outbox.service";
import { recordAudit } from "./audit.service";

export const RESET_TOKEN_TTL_MS = 60 * 60 * 1000;
/** More requests than this per user and hour send nothing more (the answer stays the same). */
export const RESET_REQUESTS_PER_HOUR = 3;
/** One message for an unknown, expired or used token, so the answer tells nothing about which. */
export const INVALID_RESET_TOKEN = "This password reset link is not valid any more. Ask for a new one.";

/** 256 random bits, URL-safe. */
export const newResetToken = () => randomBytes(32).toString("base64url");
export const hashResetToken = (token: string) => createHash("sha256").update(token, "utf8").digest("hex");

export class PasswordResetService {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly options: { bcryptRounds: number; publicUrl: string },
  ) {}

  /**
   * Issues a one-time reset token and puts the e-mail in the outbox, both in one transaction. Unknown or
   * deactivated e-mails (and users past the hourly limit) get nothing; the caller answers the same anyway.
   */
  async request(email: string, meta: { ip?: string } = {}): Promise<void> {
    const user = await User.findOne({ where: { email } });
    if (!user || !user.active) return;
    await this.sequelize.transaction(async (transaction) => {
      const recent = await PasswordResetToken.count({
        where: { userId: user.id, createdAt: { [Op.gt]: new Date(Date.now() - 60 * 60 * 1000) } },
        transaction,
      });
      if (recent >= RESET_REQUESTS_PER_HOUR) return;
      const token = newResetToken();
      await PasswordResetToken.create(
        {
          companyId: user.companyId,
          userId: user.id,
          tokenHash: hashResetToken(token),
          expiresAt: new Date(Date.now() + RESET_TOKEN_TTL_MS),
          requestedIp: meta.ip?.slice(0, 45) ?? null,
        },
        { transaction },
      );
      const link = `${this.options.publicUrl.replace(/\/+$/, "")}/reset-password?token=${token}`;
      const mail = passwordResetEmail({ name: user.name, link, expiresInMinutes: RESET_TOKEN_TTL_MS / 60_000 });
      await enqueueEmail({ to: user.email, ...mail }, { transaction, companyId: user.companyId, kind: "password_reset" });
      await recordAudit(
        {
          companyId: user.companyId,
          actorId: null,
          entityType: "user",
          entityId: user.id,
          action: "password_reset_requested",
          changes: meta.ip ? { ip: meta.ip } : null,
        },
        transaction,
      );
    });
  }

  /**
   * Sets a new password with a token from the e-mail: the token and every other open token of the user
   * are used up, the user's other sessions end, and the user gets a notice. `keepSid` is the session of
   * the request (kept if it already belongs to the user).
   */
  async reset(token: string, password: string, keepSid?: string): Promise<void> {
    const tokenHash = hashResetToken(token);
    const passwordHash = await hashPassword(password, this.options.bcryptRounds);
    await this.sequelize.transaction(async (transaction) => {
      const now = new Date();
      const row = await PasswordResetToken.findOne({ where: { tokenHash }, transaction, lock: transaction.LOCK.UPDATE });
      const invalid = () => new HttpError(400, "invalid_reset_token", INVALID_RESET_TOKEN);
      if (!row || row.usedAt || row.expiresAt.getTime() <= now.getTime()) throw invalid();
      const user = await User.findOne({ where: { id: row.userId }, transaction, lock: transaction.LOCK.UPDATE });
      if (!user || !user.active) throw invalid();
      await user.update({ passwordHash }, { transaction });
      await PasswordResetToken.update({ usedAt: now }, { where: { userId: user.id, usedAt: null }, transaction });
      await Session.destroy({
        where: { userId: user.id, ...(keepSid ? { sid: { [Op.ne]: keepSid } } : {}) },
        transaction,
      });
      await enqueueEmail(
        { to: user.email, ...passwordChangedEmail({ name: user.name }) },
        { transaction, companyId: user.companyId, kind: "password_changed" },
      );
      await recordAudit(
        { companyId: user.companyId, actorId: user.id, entityType: "user", entityId: user.id, action: "password_reset" },
        transaction,
      );
    });
  }
}
