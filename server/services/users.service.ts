import { Op, type Sequelize } from "sequelize";
import type { CreateUserInput, UpdateUserInput } from "../../shared/schemas/auth";
import { Session, User } from "../models/index";
import { badRequest, conflict, notFound } from "../errors";
import { hashPassword, verifyPassword } from "../auth/password";
import { recordAudit } from "./audit.service";

type Actor = Express.User;

export class UsersService {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly bcryptRounds: number,
  ) {}

  list(actor: Actor) {
    return User.findAll({ where: { companyId: actor.companyId }, order: [["name", "ASC"], ["id", "ASC"]] });
  }

  /** A user of the actor's company, or 404 (another company's id never leaks). */
  async get(id: number, actor: Actor): Promise<User> {
    const user = await User.findOne({ where: { id, companyId: actor.companyId } });
    if (!user) throw notFound("User");
    return user;
  }

  async create(input: CreateUserInput, actor: Actor): Promise<User> {
    const existing = await User.findOne({ where: { email: input.email } });
    if (existing) throw conflict("email_taken", "A user with that e-mail already exists");
    const passwordHash = await hashPassword(input.password, this.bcryptRounds);
    return this.sequelize.transaction(async (transaction) => {
      const user = await User.create(
        { companyId: actor.companyId, email: input.email, name: input.name, role: input.role, passwordHash },
        { transaction },
      );
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "user",
          entityId: user.id,
          action: "created",
          changes: { email: user.email, name: user.name, role: user.role },
        },
        transaction,
      );
      return user;
    });
  }

  async update(id: number, input: UpdateUserInput, actor: Actor): Promise<User> {
    return this.sequelize.transaction(async (transaction) => {
      // Lock the company's owners so two concurrent demotions cannot both pass the last-owner check.
      const owners = await User.findAll({
        where: { companyId: actor.companyId, role: "owner", active: true },
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      const user = await User.findOne({ where: { id, companyId: actor.companyId }, transaction, lock: transaction.LOCK.UPDATE });
      if (!user) throw notFound("User");
      const losesOwner =
        user.role === "owner" && user.active && ((input.role && input.role !== "owner") || input.active === false);
      if (losesOwner && owners.length <= 1) {
        throw conflict("last_owner", "The company needs at least one active owner; make someone else owner first");
      }
      const changes: Record<string, unknown> = {};
      if (input.role !== undefined && input.role !== user.role) changes.role = { from: user.role, to: input.role };
      if (input.active !== undefined && input.active !== user.active) changes.active = { from: user.active, to: input.active };
      if (input.name !== undefined && input.name !== user.name) changes.name = { from: user.name, to: input.name };
      if (Object.keys(changes).length === 0) return user;
      await user.update({ role: input.role ?? user.role, active: input.active ?? user.active, name: input.name ?? user.name }, { transaction });
      if (input.active === false) {
        // Deactivation ends the user's live sessions at once.
        await Session.destroy({ where: { userId: user.id }, transaction });
      }
      await recordAudit(
        { companyId: actor.companyId, actorId: actor.id, entityType: "user", entityId: user.id, action: "updated", changes },
        transaction,
      );
      return user;
    });
  }

  /** The owner sets a new password for a team member; their other sessions end. */
  async setPassword(id: number, password: string, actor: Actor): Promise<void> {
    const passwordHash = await hashPassword(password, this.bcryptRounds);
    await this.sequelize.transaction(async (transaction) => {
      const user = await User.findOne({ where: { id, companyId: actor.companyId }, transaction });
      if (!user) throw notFound("User");
      await user.update({ passwordHash }, { transaction });
      if (user.id !== actor.id) await Session.destroy({ where: { userId: user.id }, transaction });
      await recordAudit(
        { companyId: actor.companyId, actorId: actor.id, entityType: "user", entityId: user.id, action: "password_set" },
        transaction,
      );
    });
  }

  /** A user changes their own password; the current one is required. */
  async changeOwnPassword(actor: Actor, currentPassword: string, newPassword: string, keepSid: string): Promise<void> {
    const user = await User.findByPk(actor.id);
    if (!user) throw notFound("User");
    if (!(await verifyPassword(currentPassword, user.passwordHash))) {
      throw badRequest("Please check the highlighted fields", { currentPassword: "That is not your current password" });
    }
    const passwordHash = await hashPassword(newPassword, this.bcryptRounds);
    await this.sequelize.transaction(async (transaction) => {
      await user.update({ passwordHash }, { transaction });
      // Other devices signed in as this user are signed out; this session stays.
      await Session.destroy({ where: { userId: user.id, sid: { [Op.ne]: keepSid } }, transaction });
      await recordAudit(
        { companyId: user.companyId, actorId: user.id, entityType: "user", entityId: user.id, action: "password_changed" },
        transaction,
      );
    });
  }
}
