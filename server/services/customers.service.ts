import { Op, type Sequelize, type Transaction, type WhereOptions } from "sequelize";
import type { CustomerInput, CustomerListQuery, CustomerUpdate } from "../../shared/schemas/customer";
import { Customer } from "../models/index";
import { conflict, notFound } from "../errors";
import { recordAudit } from "./audit.service";

type Actor = Express.User;

/** `%text%` for LIKE, with the pattern characters in the user's text taken literally. */
export const likeContains = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

const FIELDS = ["name", "email", "phone", "addressLine1", "addressLine2", "city", "region", "postalCode", "notes"] as const;

export class CustomersService {
  constructor(private readonly sequelize: Sequelize) {}

  async list(query: CustomerListQuery, actor: Actor) {
    const where: WhereOptions<Customer>[] = [
      { companyId: actor.companyId },
      { archivedAt: query.archived ? { [Op.ne]: null } : null },
    ];
    if (query.q) {
      const like = likeContains(query.q);
      where.push({
        [Op.or]: [
          { name: { [Op.like]: like } },
          { email: { [Op.like]: like } },
          { phone: { [Op.like]: like } },
          { addressLine1: { [Op.like]: like } },
          { city: { [Op.like]: like } },
          { postalCode: { [Op.like]: like } },
        ],
      });
    }
    return Customer.findAndCountAll({
      where: { [Op.and]: where },
      order: [["name", "ASC"], ["id", "ASC"]],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
  }

  /** A customer of the actor's company, or 404. */
  async get(id: number, actor: Actor, transaction?: Transaction): Promise<Customer> {
    const customer = await Customer.findOne({
      where: { id, companyId: actor.companyId },
      transaction,
      lock: transaction ? transaction.LOCK.UPDATE : undefined,
    });
    if (!customer) throw notFound("Customer");
    return customer;
  }

  /** Creates a customer; pass a transaction to make it part of a larger write (a job with a new customer). */
  async create(input: CustomerInput, actor: Actor, transaction?: Transaction): Promise<Customer> {
    const run = async (t: Transaction) => {
      const customer = await Customer.create(
        {
          companyId: actor.companyId,
          name: input.name,
          email: input.email ?? null,
          phone: input.phone ?? null,
          addressLine1: input.addressLine1 ?? null,
          addressLine2: input.addressLine2 ?? null,
          city: input.city ?? null,
          region: input.region ?? null,
          postalCode: input.postalCode ?? null,
          notes: input.notes ?? null,
        },
        { transaction: t },
      );
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "customer",
          entityId: customer.id,
          action: "created",
          changes: { name: customer.name, email: customer.email },
        },
        t,
      );
      return customer;
    };
    return transaction ? run(transaction) : this.sequelize.transaction(run);
  }

  async update(id: number, input: CustomerUpdate, actor: Actor): Promise<Customer> {
    return this.sequelize.transaction(async (transaction) => {
      const customer = await this.get(id, actor, transaction);
      if (customer.archivedAt) throw conflict("archived", "This customer is archived; restore them to make changes");
      const changes: Record<string, { from: unknown; to: unknown }> = {};
      for (const key of FIELDS) {
        const to = input[key];
        if (to === undefined || to === customer[key]) continue;
        changes[key] = { from: customer[key], to };
        customer.set(key, to as never);
      }
      if (Object.keys(changes).length === 0) return customer;
      await customer.save({ transaction });
      await recordAudit(
        { companyId: actor.companyId, actorId: actor.id, entityType: "customer", entityId: customer.id, action: "updated", changes },
        transaction,
      );
      return customer;
    });
  }

  /** Archives (archived: true) or restores a customer; doing it twice changes nothing. */
  async setArchived(id: number, archived: boolean, actor: Actor): Promise<Customer> {
    return this.sequelize.transaction(async (transaction) => {
      const customer = await this.get(id, actor, transaction);
      if (Boolean(customer.archivedAt) === archived) return customer;
      await customer.update({ archivedAt: archived ? new Date() : null }, { transaction });
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "customer",
          entityId: customer.id,
          action: archived ? "archived" : "restored",
        },
        transaction,
      );
      return customer;
    });
  }
}
