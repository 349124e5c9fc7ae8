import { UniqueConstraintError, type Sequelize, type Transaction } from "sequelize";
import type { RoofDocument, RoofDto, RoofSave } from "../../shared/schemas/roof";
import { Roof } from "../models/index";
import { executeBinary, sqlDateTime } from "../db/sql";
import { conflict, notFound } from "../errors";
import { presentRoof } from "../presenters/roof.presenter";
import { parseJsonColumn } from "../presenters/job.presenter";
import { recordAudit, type AuditEntry } from "./audit.service";
import { JobsService } from "./jobs.service";
import { rulesOfItems, ruleSourceItems } from "./price-book-rules";
import { enginePool } from "./engine-pool";
import type { StoredTakeoff } from "./roof-takeoff";

type Actor = Express.User;

/** What a roof save answers: the saved document with its new version, and the takeoff stored with it. */
export type SavedRoof = RoofDto & { takeoff: StoredTakeoff };

/** The save's first statement: the locked job row and what the save reads beside it. */
interface LockedJobRow {
  status: string;
  archived: number | string;
  site: unknown;
  roofVersion: number | string | null;
  storedUnderlay: unknown;
}

const stale = (currentVersion: number) =>
  conflict("stale_version", "Someone saved this roof after you opened it; reload to see their changes, then apply yours", {
    currentVersion,
  });

export class RoofsService {
  private readonly jobs: JobsService;

  constructor(private readonly sequelize: Sequelize) {
    this.jobs = new JobsService(sequelize);
  }

  /** The job's roof document; version 0 with empty planes and stacks when none was saved yet. */
  async get(jobId: number, actor: Actor): Promise<RoofDto> {
    await this.jobs.get(jobId, actor);
    return presentRoof(await Roof.findOne({ where: { jobId } }));
  }

  /** The stored takeoff, or null when the job has no roof yet. */
  async takeoff(jobId: number, actor: Actor): Promise<StoredTakeoff | null> {
    await this.jobs.get(jobId, actor);
    const roof = await Roof.findOne({ where: { jobId }, attributes: ["id", "takeoff"] });
    return roof?.takeoff ? parseJsonColumn<StoredTakeoff>(roof.takeoff) : null;
  }

  /**
   * Saves the roof with optimistic locking: `input.version` must be the stored version (0 when none is
   * stored). The first save creates version 1; later saves run
   * `UPDATE roofs SET …, version = version + 1 WHERE job_id = ? AND version = ?`, and no affected row
   * means someone else saved first (409 with the current version). The takeoff is recomputed here from
   * the saved document, the job's site and the company's rules; jobs.squares follows it, and a lead
   * becomes estimating with its first roof. One transaction, with the audit rows.
   */
  async save(jobId: number, input: RoofSave, actor: Actor): Promise<SavedRoof> {
    return JSON.parse((await this.saveWithJson(jobId, input, actor)).json) as SavedRoof;
  }

  /**
   * `save`, answering the saved roof as JSON text (what `JSON.stringify` gives for `save`'s answer), built from
   * the parts serialised once for the stored document and takeoff: PUT /api/jobs/:id/roof sends it as it is
   * instead of serialising 50 KB a second time.
   */
  async saveWithJson(jobId: number, input: RoofSave, actor: Actor): Promise<{ json: string }> {
    try {
      return await this.sequelize.transaction((t) => this.saveIn(jobId, input, actor, t));
    } catch (err) {
      // Two first saves racing past the lock would meet the unique job_id: the loser is stale.
      if (err instanceof UniqueConstraintError) {
        const current = await Roof.findOne({ where: { jobId }, attributes: ["version"] });
        throw stale(current?.version ?? 0);
      }
      throw err;
    }
  }

  private async saveIn(jobId: number, input: RoofSave, actor: Actor, transaction: Transaction): Promise<{ json: string }> {
    const keepUnderlay = input.underlay === undefined;
    const crew = actor.role === "crew";
    // The job row, locked (saves of one roof and site edits run one after another), with what the save needs of
    // the stored roof: its version, and its underlay when the save leaves it out (never the whole document and
    // takeoff, which are large and about to be replaced). The subqueries take no row locks and run once the lock
    // is granted, so they see what the save before this one committed. A job the actor may not see is 404, as
    // JobsService.get. The company's price-book items (for the engine's rules) are asked for in the same round
    // trip: the driver sends both statements at once and the database runs them in turn.
    const [[job], ruleItems] = await Promise.all([
      executeBinary<LockedJobRow[]>(
        this.sequelize,
        transaction,
        `SELECT j.status, j.archived_at IS NOT NULL AS archived, j.site,
                (SELECT r.version FROM roofs r WHERE r.job_id = j.id) AS roofVersion,
                ${keepUnderlay ? "(SELECT JSON_EXTRACT(r.document, '$.underlay') FROM roofs r WHERE r.job_id = j.id)" : "NULL"} AS storedUnderlay
           FROM jobs j
          WHERE j.id = ? AND j.company_id = ?${crew ? " AND j.archived_at IS NULL AND EXISTS (SELECT 1 FROM job_crew jc WHERE jc.job_id = j.id AND jc.user_id = ?)" : ""}
            FOR UPDATE`,
        crew ? [jobId, actor.companyId, actor.id] : [jobId, actor.companyId],
      ),
      ruleSourceItems(actor.companyId, transaction),
    ]);
    if (!job) throw notFound("Job");
    if (Number(job.archived)) throw conflict("archived", "This job is archived; restore it to make changes");
    const existing = job.roofVersion !== null && job.roofVersion !== undefined;
    const currentVersion = existing ? Number(job.roofVersion) : 0;
    if (input.version !== currentVersion) throw stale(currentVersion);

    const storedUnderlay = job.storedUnderlay;
    const kept = storedUnderlay === null || storedUnderlay === undefined ? undefined : parseJsonColumn<RoofDocument["underlay"]>(storedUnderlay);
    const underlay = keepUnderlay ? (kept ?? undefined) : (input.underlay ?? undefined);
    const document: RoofDocument = {
      planes: input.planes,
      stacks: input.stacks,
      defaultStackId: input.defaultStackId,
      ...(underlay ? { underlay } : {}),
    };
    // The planes and stacks were parsed and cross-checked by roofSaveSchema: the engine takes them as they are, in
    // a worker thread (the event loop serves other requests meanwhile; the job row stays locked). Each plane's
    // geometry is worked out again there: what the schema's checks kept does not travel with the copy.
    const rules = rulesOfItems(ruleItems);
    const takeoff = await enginePool().storedTakeoff(document, parseJsonColumn(job.site), rules);
    const now = sqlDateTime(new Date());
    // Each part serialised once: the stored document is `JSON.stringify(document)` and the answer
    // `JSON.stringify({ ...presentRoofDocument(document, version), takeoff })`, both put together from these.
    const parts = {
      planes: JSON.stringify(document.planes),
      stacks: JSON.stringify(document.stacks),
      defaultStackId: JSON.stringify(document.defaultStackId),
      underlay: document.underlay ? `,"underlay":${JSON.stringify(document.underlay)}` : "",
      takeoff: takeoff.json,
    };
    const head = `{"planes":${parts.planes},"stacks":${parts.stacks},"defaultStackId":${parts.defaultStackId}`;

    const squares = takeoff.squares;
    const version = existing ? input.version + 1 : 1;
    const audit: AuditEntry = {
      companyId: actor.companyId,
      actorId: actor.id,
      entityType: "roof",
      entityId: jobId,
      jobId,
      action: existing ? "saved" : "created",
      changes: {
        version: { from: currentVersion, to: version },
        planes: document.planes.length,
        stacks: document.stacks.length,
        squares,
        ...(input.underlay !== undefined ? { underlay: input.underlay ? "set" : "removed" } : {}),
      },
    };
    if (!existing) {
      await Roof.create({ jobId, companyId: actor.companyId, version: 1, document, takeoff: JSON.parse(takeoff.json) as StoredTakeoff }, { transaction });
      // What `job.save()` wrote for the job (its squares and updated time), without a model object.
      await executeBinary(this.sequelize, transaction, "UPDATE jobs SET squares = ?, updated_at = ? WHERE id = ?", [squares, now, jobId]);
      await recordAudit(audit, transaction);
    } else {
      // The roof and the job's squares and updated time in one statement, guarded by the version read above (the
      // job row lock already serialises saves); the 56 KB of JSON go as binary-protocol values rather than
      // escaped into the SQL text. The audit row is sent with it, without waiting for its answer: the driver
      // pipelines the two, and when the roof was not written the transaction is rolled back, audit row and all.
      const [written] = await Promise.all([
        executeBinary(
          this.sequelize,
          transaction,
          `UPDATE roofs r JOIN jobs j ON j.id = r.job_id
              SET r.document = ?, r.takeoff = ?, r.version = r.version + 1, r.updated_at = ?, j.squares = ?, j.updated_at = ?
            WHERE r.job_id = ? AND r.version = ?`,
          [`${head}${parts.underlay}}`, parts.takeoff, now, squares, now, jobId, input.version],
        ),
        recordAudit(audit, transaction),
      ]);
      // Changed rows (the driver does not count rows found unchanged): the roof's, whose version always moves,
      // and the job's unless the same squares were saved within the same second. None: the roof was not written.
      if (Number(written.affectedRows) < 1) {
        const current = await Roof.findOne({ where: { jobId }, attributes: ["version"], transaction });
        throw stale(current?.version ?? 0);
      }
    }
    if (job.status === "lead") {
      // Once per job: the status move goes through the jobs service (its own audit row) with the job's model.
      await this.jobs.applyStatus(await this.jobs.get(jobId, actor, transaction), "estimating", "first roof saved", actor, transaction);
    }

    return {
      json: `${head},"version":${version}${parts.underlay},"takeoff":${parts.takeoff}}`,
    };
  }
}
