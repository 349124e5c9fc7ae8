import { QueryTypes, UniqueConstraintError, literal, type Sequelize, type Transaction } from "sequelize";
import type { RoofDocument, RoofDto, RoofSave } from "../../shared/schemas/roof";
import { Roof } from "../models/index";
import { conflict } from "../errors";
import { presentRoof, presentRoofDocument } from "../presenters/roof.presenter";
import { parseJsonColumn } from "../presenters/job.presenter";
import { recordAudit } from "./audit.service";
import { JobsService } from "./jobs.service";
import { computeStoredTakeoff, takeoffSquares, type StoredTakeoff } from "./roof-takeoff";

type Actor = Express.User;

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
  async save(jobId: number, input: RoofSave, actor: Actor): Promise<RoofDto & { takeoff: StoredTakeoff }> {
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

  private async saveIn(jobId: number, input: RoofSave, actor: Actor, transaction: Transaction) {
    // Locks the job row: saves of one roof (and site edits) run one after another.
    const job = await this.jobs.get(jobId, actor, transaction);
    if (job.archivedAt) throw conflict("archived", "This job is archived; restore it to make changes");
    // Only the version, and the stored underlay when the save leaves it out (never the whole document and
    // takeoff, which are large and about to be replaced).
    const existing = await Roof.findOne({
      where: { jobId },
      attributes: ["id", "version", ...(input.underlay === undefined ? [[literal("JSON_EXTRACT(document, '$.underlay')"), "storedUnderlay"] as [ReturnType<typeof literal>, string]] : [])],
      transaction,
    });
    const currentVersion = existing?.version ?? 0;
    if (input.version !== currentVersion) throw stale(currentVersion);

    const storedUnderlay = existing?.get("storedUnderlay" as "id") as unknown;
    const kept = storedUnderlay === null || storedUnderlay === undefined ? undefined : parseJsonColumn<RoofDocument["underlay"]>(storedUnderlay);
    const underlay = input.underlay === undefined ? (kept ?? undefined) : (input.underlay ?? undefined);
    const document: RoofDocument = {
      planes: input.planes,
      stacks: input.stacks,
      defaultStackId: input.defaultStackId,
      ...(underlay ? { underlay } : {}),
    };
    const takeoff = await computeStoredTakeoff(document, parseJsonColumn(job.site), actor.companyId, transaction);

    let version: number;
    if (!existing) {
      await Roof.create({ jobId, companyId: actor.companyId, version: 1, document, takeoff }, { transaction });
      version = 1;
    } else {
      // One plain UPDATE, guarded by the version read above (the job row lock already serialises saves).
      const affected = Number(
        await this.sequelize.query(
          "UPDATE roofs SET document = ?, takeoff = ?, version = version + 1, updated_at = ? WHERE job_id = ? AND version = ?",
          { replacements: [JSON.stringify(document), JSON.stringify(takeoff), new Date(), jobId, input.version], type: QueryTypes.BULKUPDATE, transaction },
        ),
      );
      if (affected !== 1) {
        const current = await Roof.findOne({ where: { jobId }, attributes: ["version"], transaction });
        throw stale(current?.version ?? 0);
      }
      version = input.version + 1;
    }

    const squares = takeoffSquares(takeoff);
    job.squares = squares;
    job.changed("updatedAt", true);
    await job.save({ transaction });
    await recordAudit(
      {
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
      },
      transaction,
    );
    if (job.status === "lead") await this.jobs.applyStatus(job, "estimating", "first roof saved", actor, transaction);

    return { ...presentRoofDocument(document, version), takeoff };
  }
}
