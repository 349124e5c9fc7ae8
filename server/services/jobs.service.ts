import { Op, literal, type Order, type Sequelize, type Transaction, type WhereOptions } from "sequelize";
import {
  MANUAL_STATUS_MOVES,
  canMoveJobStatus,
  jobSiteSchema,
  type JobAssignment,
  type JobInput,
  type JobListQuery,
  type JobSort,
  type JobStatus,
  type JobUpdate,
} from "../../shared/schemas/job";
import type { RoofDocument } from "../../shared/schemas/roof";
import { Customer, Job, JobCrew, Roof, User } from "../models/index";
import { badRequest, conflict, notFound } from "../errors";
import { recordAudit } from "./audit.service";
import { CustomersService, likeContains } from "./customers.service";
import { computeStoredTakeoff, takeoffSquares } from "./roof-takeoff";
import { parseJsonColumn } from "../presenters/job.presenter";
import { proposalProgressFor } from "./proposal-progress";

type Actor = Express.User;

const SITE_ADDRESS = ["siteAddressLine1", "siteAddressLine2", "siteCity", "siteRegion", "sitePostalCode"] as const;

type SortKey = Exclude<JobSort, `-${string}`>;

const SORTS: Record<SortKey, (dir: "ASC" | "DESC") => Order> = {
  updatedAt: (d) => [["updatedAt", d], ["id", d]],
  createdAt: (d) => [["createdAt", d], ["id", d]],
  customer: (d) => [[{ model: Customer, as: "customer" }, "name", d], ["id", d]],
  status: (d) => [["status", d], ["updatedAt", "DESC"], ["id", "DESC"]],
  squares: (d) => [["squares", d], ["id", d]],
  quoteTotal: (d) => [["quoteTotalCents", d], ["id", d]],
};

function orderFor(sort: JobSort): Order {
  const desc = sort.startsWith("-");
  const key = (desc ? sort.slice(1) : sort) as SortKey;
  return SORTS[key](desc ? "DESC" : "ASC");
}

/** Only jobs the crew member is assigned to. */
const assignedTo = (userId: number) =>
  literal(`(SELECT jc.job_id FROM job_crew jc WHERE jc.user_id = ${Number(userId)})`);

const detailIncludes = [
  { model: Customer, as: "customer" },
  { model: User, as: "estimator", attributes: ["id", "name"] },
  { model: User, as: "crew", attributes: ["id", "name"], through: { attributes: [] } },
];

export class JobsService {
  private readonly customers: CustomersService;

  constructor(private readonly sequelize: Sequelize) {
    this.customers = new CustomersService(sequelize);
  }

  /**
   * The board: company-scoped, crew limited to their jobs, filtered, sorted, one page. Built for a large
   * table: the filters (text search included, through a customer subquery) run on `jobs` alone, so the
   * count and the page of ids use the board indexes; the page's 50 rows are then read with their joins.
   */
  async list(query: JobListQuery, actor: Actor): Promise<{ rows: Job[]; count: number }> {
    const archived = query.archived === true && actor.role !== "crew"; // crew see live jobs only
    const where: WhereOptions[] = [{ companyId: actor.companyId }, { archivedAt: archived ? { [Op.ne]: null } : null }];
    if (actor.role === "crew") where.push({ id: { [Op.in]: assignedTo(actor.id) } });
    if (query.status?.length) where.push({ status: { [Op.in]: query.status } });
    if (query.estimatorId === "none") where.push({ estimatorId: null });
    else if (query.estimatorId !== undefined) where.push({ estimatorId: query.estimatorId });
    if (query.customerId !== undefined) where.push({ customerId: query.customerId });
    if (query.q) {
      const like = likeContains(query.q);
      const matchingCustomers = literal(
        `(SELECT c.id FROM customers c WHERE c.company_id = ${Number(actor.companyId)} AND (c.name LIKE ${this.sequelize.escape(like)} OR c.email LIKE ${this.sequelize.escape(like)}))`,
      );
      where.push({
        [Op.or]: [
          { customerId: { [Op.in]: matchingCustomers } },
          { siteAddressLine1: { [Op.like]: like } },
          { siteCity: { [Op.like]: like } },
          { sitePostalCode: { [Op.like]: like } },
        ],
      });
    }
    const filter = { [Op.and]: where };
    const byCustomer = query.sort === "customer" || query.sort === "-customer";
    const [count, page] = await Promise.all([
      Job.count({ where: filter }),
      Job.findAll({
        where: filter,
        attributes: ["id"],
        include: byCustomer ? [{ model: Customer, as: "customer", attributes: [], required: true }] : [],
        order: orderFor(query.sort),
        limit: query.pageSize,
        offset: (query.page - 1) * query.pageSize,
        raw: true,
      }),
    ]);
    const ids = page.map((r) => r.id);
    if (ids.length === 0) return { rows: [], count };
    const rows = await Job.findAll({
      where: { id: { [Op.in]: ids } },
      attributes: { exclude: ["site", "notes"] },
      include: [
        { model: Customer, as: "customer", attributes: ["id", "name"] },
        { model: User, as: "estimator", attributes: ["id", "name"] },
      ],
    });
    const at = new Map(ids.map((id, i) => [id, i]));
    rows.sort((a, b) => at.get(a.id)! - at.get(b.id)!);
    const progress = await proposalProgressFor(ids); // one extra query for the page's jobs
    for (const j of rows) j.proposalProgress = progress.get(j.id) ?? null;
    return { rows, count };
  }

  /**
   * A job the actor may see, or 404: same company, and for crew only a live job they are assigned to.
   * With a transaction the row is locked for update.
   */
  async get(id: number, actor: Actor, transaction?: Transaction): Promise<Job> {
    const job = await Job.findOne({
      where: { id, companyId: actor.companyId },
      transaction,
      lock: transaction ? transaction.LOCK.UPDATE : undefined,
    });
    if (!job) throw notFound("Job");
    if (actor.role === "crew") {
      const assigned = job.archivedAt === null && (await JobCrew.count({ where: { jobId: id, userId: actor.id }, transaction })) > 0;
      if (!assigned) throw notFound("Job");
    }
    return job;
  }

  /** The job with its customer, estimator and crew, for the presenter. */
  async getDetail(id: number, actor: Actor, transaction?: Transaction): Promise<Job> {
    await this.get(id, actor, transaction);
    const job = await Job.findOne({ where: { id, companyId: actor.companyId }, include: detailIncludes, transaction });
    if (!job) throw notFound("Job");
    job.proposalProgress = (await proposalProgressFor([job.id], transaction)).get(job.id) ?? null;
    return job;
  }

  async create(input: JobInput, actor: Actor): Promise<Job> {
    const id = await this.sequelize.transaction(async (transaction) => {
      let customer: Customer;
      if (input.customerId !== undefined) {
        const found = await Customer.findOne({ where: { id: input.customerId, companyId: actor.companyId }, transaction });
        if (!found) throw badRequest("Please check the highlighted fields", { customerId: "Unknown customer" });
        if (found.archivedAt) {
          throw badRequest("Please check the highlighted fields", { customerId: "This customer is archived; restore them first" });
        }
        customer = found;
      } else {
        customer = await this.customers.create(input.customer!, actor, transaction);
      }
      let estimatorId: number | null = actor.role === "estimator" ? actor.id : null;
      if (input.estimatorId !== undefined) {
        estimatorId = input.estimatorId;
        if (estimatorId !== null) await this.checkEstimator(estimatorId, actor, transaction);
      }
      // A site address left out entirely is the customer's own address (the usual re-roof).
      const noSiteAddress = SITE_ADDRESS.every((k) => input[k] === undefined || input[k] === null);
      const job = await Job.create(
        {
          companyId: actor.companyId,
          customerId: customer.id,
          siteAddressLine1: noSiteAddress ? customer.addressLine1 : (input.siteAddressLine1 ?? null),
          siteAddressLine2: noSiteAddress ? customer.addressLine2 : (input.siteAddressLine2 ?? null),
          siteCity: noSiteAddress ? customer.city : (input.siteCity ?? null),
          siteRegion: noSiteAddress ? customer.region : (input.siteRegion ?? null),
          sitePostalCode: noSiteAddress ? customer.postalCode : (input.sitePostalCode ?? null),
          status: "lead",
          estimatorId,
          site: input.site ?? jobSiteSchema.parse({}),
          notes: input.notes ?? null,
        },
        { transaction },
      );
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "job",
          entityId: job.id,
          jobId: job.id,
          action: "created",
          changes: { customerId: customer.id, customerName: customer.name, status: "lead", estimatorId },
        },
        transaction,
      );
      return job.id;
    });
    return this.getDetail(id, actor);
  }

  async update(id: number, input: JobUpdate, actor: Actor): Promise<Job> {
    await this.sequelize.transaction(async (transaction) => {
      const job = await this.get(id, actor, transaction);
      if (job.archivedAt) throw conflict("archived", "This job is archived; restore it to make changes");
      const changes: Record<string, unknown> = {};

      if (input.status !== undefined && input.status !== job.status) {
        await this.checkManualMove(job, input.status, transaction);
        changes.status = { from: job.status, to: input.status };
        job.status = input.status;
      }
      if (input.customerId !== undefined && input.customerId !== job.customerId) {
        const customer = await Customer.findOne({ where: { id: input.customerId, companyId: actor.companyId }, transaction });
        if (!customer) throw badRequest("Please check the highlighted fields", { customerId: "Unknown customer" });
        if (customer.archivedAt) {
          throw badRequest("Please check the highlighted fields", { customerId: "This customer is archived; restore them first" });
        }
        changes.customerId = { from: job.customerId, to: customer.id };
        job.customerId = customer.id;
      }
      for (const key of [...SITE_ADDRESS, "notes"] as const) {
        const to = input[key];
        if (to === undefined || to === job[key]) continue;
        changes[key] = { from: job[key], to };
        job.set(key, to);
      }
      let siteChanged = false;
      if (input.site !== undefined) {
        const before = parseJsonColumn<typeof input.site>(job.site);
        if (JSON.stringify(before) !== JSON.stringify(input.site)) {
          changes.site = { from: before, to: input.site };
          job.site = input.site;
          siteChanged = true;
        }
      }
      if (Object.keys(changes).length === 0) return;

      if (siteChanged) {
        // The takeoff depends on the site (wind, ice barrier, ventilation): recompute the stored one.
        const roof = await Roof.findOne({ where: { jobId: job.id }, transaction, lock: transaction.LOCK.UPDATE });
        if (roof) {
          const takeoff = await computeStoredTakeoff(parseJsonColumn<RoofDocument>(roof.document), job.site, actor.companyId, transaction);
          await roof.update({ takeoff }, { transaction });
          job.squares = takeoffSquares(takeoff);
        }
      }
      await job.save({ transaction });
      await recordAudit(
        { companyId: actor.companyId, actorId: actor.id, entityType: "job", entityId: job.id, jobId: job.id, action: "updated", changes },
        transaction,
      );
    });
    return this.getDetail(id, actor);
  }

  /** Archives or restores a job; doing it twice changes nothing. */
  async setArchived(id: number, archived: boolean, actor: Actor): Promise<Job> {
    await this.sequelize.transaction(async (transaction) => {
      const job = await this.get(id, actor, transaction);
      if (Boolean(job.archivedAt) === archived) return;
      await job.update({ archivedAt: archived ? new Date() : null }, { transaction });
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "job",
          entityId: job.id,
          jobId: job.id,
          action: archived ? "archived" : "restored",
        },
        transaction,
      );
    });
    return this.getDetail(id, actor);
  }

  /** Sets the job's estimator and replaces its crew; each id must be an active user of the right role. */
  async setAssignment(id: number, input: JobAssignment, actor: Actor): Promise<Job> {
    await this.sequelize.transaction(async (transaction) => {
      const job = await this.get(id, actor, transaction);
      if (job.archivedAt) throw conflict("archived", "This job is archived; restore it to make changes");
      const fields: Record<string, string> = {};
      if (input.estimatorId !== null) {
        const ok = await User.count({
          where: { id: input.estimatorId, companyId: actor.companyId, active: true, role: { [Op.in]: ["estimator", "owner"] } },
          transaction,
        });
        if (!ok) fields.estimatorId = "Pick an active estimator or owner of your company";
      }
      if (input.crewIds.length > 0) {
        const crew = await User.findAll({
          where: { id: { [Op.in]: input.crewIds }, companyId: actor.companyId, active: true, role: "crew" },
          attributes: ["id"],
          transaction,
        });
        const found = new Set(crew.map((u) => u.id));
        input.crewIds.forEach((cid, i) => {
          if (!found.has(cid)) fields[`crewIds.${i}`] = "Pick an active crew member of your company";
        });
      }
      if (Object.keys(fields).length > 0) throw badRequest("Please check the highlighted fields", fields);

      const before = (await JobCrew.findAll({ where: { jobId: job.id }, transaction })).map((r) => r.userId).sort((a, b) => a - b);
      const after = [...input.crewIds].sort((a, b) => a - b);
      const changes: Record<string, unknown> = {};
      if (job.estimatorId !== input.estimatorId) changes.estimatorId = { from: job.estimatorId, to: input.estimatorId };
      if (before.join(",") !== after.join(",")) changes.crewIds = { from: before, to: after };
      if (Object.keys(changes).length === 0) return;

      await JobCrew.destroy({ where: { jobId: job.id }, transaction });
      if (after.length > 0) await JobCrew.bulkCreate(after.map((userId) => ({ jobId: job.id, userId })), { transaction });
      job.estimatorId = input.estimatorId;
      job.changed("updatedAt", true);
      await job.save({ transaction });
      await recordAudit(
        { companyId: actor.companyId, actorId: actor.id, entityType: "job", entityId: job.id, jobId: job.id, action: "assigned", changes },
        transaction,
      );
    });
    return this.getDetail(id, actor);
  }

  /**
   * Moves a job's status as a consequence of another change (a first roof, a sent, accepted, declined or
   * expired proposal), inside the caller's transaction, with an audit row. The caller decides whether the
   * move applies; `job` should have been read with a lock in the same transaction.
   */
  async applyStatus(job: Job, to: JobStatus, reason: string, actor: Actor, transaction: Transaction): Promise<void> {
    if (job.status === to) return;
    const from = job.status;
    job.status = to;
    await job.save({ transaction });
    await recordAudit(
      {
        companyId: job.companyId,
        actorId: actor.id,
        entityType: "job",
        entityId: job.id,
        jobId: job.id,
        action: "status_changed",
        changes: { status: { from, to }, reason },
      },
      transaction,
    );
  }

  private async checkEstimator(userId: number, actor: Actor, transaction: Transaction) {
    const ok = await User.count({
      where: { id: userId, companyId: actor.companyId, active: true, role: { [Op.in]: ["estimator", "owner"] } },
      transaction,
    });
    if (!ok) throw badRequest("Please check the highlighted fields", { estimatorId: "Pick an active estimator or owner of your company" });
  }

  /** A move a person may make by hand; anything else is 409 with the current status. */
  private async checkManualMove(job: Job, to: JobStatus, transaction: Transaction) {
    const refuse = (why: string) =>
      conflict("invalid_transition", why, { currentStatus: job.status, allowedStatuses: MANUAL_STATUS_MOVES[job.status as JobStatus] });
    if (!canMoveJobStatus(job.status as JobStatus, to)) {
      throw refuse(`A job cannot be moved from ${job.status} to ${to} by hand`);
    }
    if (job.status === "lost" && (to === "lead" || to === "estimating")) {
      const measured = (await Roof.count({ where: { jobId: job.id }, transaction })) > 0;
      if (to === "lead" && measured) throw refuse("This job has a measured roof; reopen it as estimating");
      if (to === "estimating" && !measured) throw refuse("This job has no roof yet; reopen it as a lead");
    }
  }
}
