import { Router, type Request } from "express";
import { auditListQuerySchema } from "../../shared/schemas/audit";
import { jobAssignmentSchema, jobInputSchema, jobListQuerySchema, jobUpdateSchema } from "../../shared/schemas/job";
import { roofSaveSchema, type RoofSave } from "../../shared/schemas/roof";
import type { AppContext } from "../app";
import { requireAuth, requireRole } from "../middleware/require-auth";
import { presentAuditEvent } from "../presenters/audit.presenter";
import { presentJob, presentJobListItem } from "../presenters/job.presenter";
import { AuditLogService } from "../services/audit-log.service";
import { JobsService } from "../services/jobs.service";
import { RoofsService } from "../services/roofs.service";
import { requireBody } from "./auth.routes";
import { parseId } from "./users.routes";

const office = requireRole("owner", "estimator");

/** The route's job id (404 for anything that is not one). */
const jobIdOf = (req: Request) => parseId(String(req.params.id), "Job");

/**
 * /api/jobs, the job's roof and takeoff, and the job's audit log. Crew read the jobs they are assigned
 * to (others answer 404) and never get price keys; every write is for owners and estimators.
 */
export function jobsRouter(ctx: Pick<AppContext, "sequelize">): Router {
  const jobs = new JobsService(ctx.sequelize);
  const roofs = new RoofsService(ctx.sequelize);
  const audit = new AuditLogService(ctx.sequelize);
  const router = Router();
  router.use(requireAuth);

  router.get("/", async (req, res) => {
    const query = jobListQuerySchema.parse(req.query);
    const { rows, count } = await jobs.list(query, req.user!);
    res.json({
      data: rows.map((j) => presentJobListItem(j, req.user!.role)),
      meta: { page: query.page, pageSize: query.pageSize, total: count },
    });
  });

  router.post("/", office, async (req, res) => {
    const input = jobInputSchema.parse(requireBody(req));
    const job = await jobs.create(input, req.user!);
    res.status(201).json({ data: presentJob(job, req.user!.role) });
  });

  router.get("/:id", async (req, res) => {
    const job = await jobs.getDetail(jobIdOf(req), req.user!);
    res.json({ data: presentJob(job, req.user!.role) });
  });

  router.patch("/:id", office, async (req, res) => {
    const id = jobIdOf(req);
    await jobs.get(id, req.user!); // 404 before validation for another company's id
    const input = jobUpdateSchema.parse(requireBody(req));
    res.json({ data: presentJob(await jobs.update(id, input, req.user!), req.user!.role) });
  });

  router.post("/:id/archive", office, async (req, res) => {
    const job = await jobs.setArchived(jobIdOf(req), true, req.user!);
    res.json({ data: presentJob(job, req.user!.role) });
  });

  router.post("/:id/restore", office, async (req, res) => {
    const job = await jobs.setArchived(jobIdOf(req), false, req.user!);
    res.json({ data: presentJob(job, req.user!.role) });
  });

  router.put("/:id/assignment", office, async (req, res) => {
    const id = jobIdOf(req);
    await jobs.get(id, req.user!);
    const input = jobAssignmentSchema.parse(requireBody(req));
    res.json({ data: presentJob(await jobs.setAssignment(id, input, req.user!), req.user!.role) });
  });

  /** `{ data: { planes, stacks, defaultStackId, version, underlay? } }`; version 0 and empty arrays before the first save. */
  router.get("/:id/roof", async (req, res) => {
    res.json({ data: await roofs.get(jobIdOf(req), req.user!) });
  });

  router.put("/:id/roof", office, async (req, res) => {
    const id = jobIdOf(req);
    let input: RoofSave;
    try {
      input = roofSaveSchema.parse(requireBody(req));
    } catch (err) {
      // A job the actor cannot see answers 404 whatever the body; the save itself checks it for a valid body
      // (in the statement that locks the job), so a good save reads the job once.
      await jobs.assertVisible(id, req.user!);
      throw err;
    }
    // `{ data: saved roof }`, the JSON put together by the service from the parts it serialised for the database.
    const { json } = await roofs.saveWithJson(id, input, req.user!);
    res.set("Content-Type", "application/json").send(`{"data":${json}}`);
  });

  /** `{ data: takeoff }`, the engine's result stored with the roof; `{ data: null }` before the first save. */
  router.get("/:id/takeoff", async (req, res) => {
    res.json({ data: await roofs.takeoff(jobIdOf(req), req.user!) });
  });

  router.get("/:id/audit", office, async (req, res) => {
    const id = jobIdOf(req);
    const query = auditListQuerySchema.parse(req.query);
    const { rows, count } = await audit.listForJob(id, query, req.user!);
    res.json({ data: rows.map(presentAuditEvent), meta: { page: query.page, pageSize: query.pageSize, total: count } });
  });

  return router;
}
