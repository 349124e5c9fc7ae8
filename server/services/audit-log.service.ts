import type { Sequelize, WhereOptions } from "sequelize";
import type { AuditListQuery } from "../../shared/schemas/audit";
import { AuditEvent, User } from "../models/index";
import { JobsService } from "./jobs.service";

type Actor = Express.User;

/** Reading the audit log: a job's events, or the whole company's (owner). Newest first. */
export class AuditLogService {
  private readonly jobs: JobsService;

  constructor(sequelize: Sequelize) {
    this.jobs = new JobsService(sequelize);
  }

  async listForJob(jobId: number, query: AuditListQuery, actor: Actor) {
    await this.jobs.get(jobId, actor);
    return this.page({ companyId: actor.companyId, jobId }, query);
  }

  listForCompany(query: AuditListQuery, actor: Actor) {
    return this.page({ companyId: actor.companyId }, query);
  }

  private page(scope: WhereOptions<AuditEvent>, query: AuditListQuery) {
    const where: WhereOptions<AuditEvent> = { ...scope };
    if (query.entityType) Object.assign(where, { entityType: query.entityType });
    if (query.actorId) Object.assign(where, { actorId: query.actorId });
    return AuditEvent.findAndCountAll({
      where,
      include: [{ model: User, as: "actor", attributes: ["id", "name"] }],
      order: [["createdAt", "DESC"], ["id", "DESC"]],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
  }
}
