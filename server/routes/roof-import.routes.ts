import { Router, type Request } from "express";
import { z, ZodError } from "zod";
import { ROOF_CSV_MAX_BYTES, defaultImportStack, parseRoofCsv, roofToCsv, type RoofCsvError } from "../../shared/roof-csv";
import { roofSaveSchema } from "../../shared/schemas/roof";
import type { AppContext } from "../app";
import { HttpError, badRequest } from "../errors";
import { requireAuth, requireRole } from "../middleware/require-auth";
import { JobsService } from "../services/jobs.service";
import { RoofsService } from "../services/roofs.service";
import { receiveFiles } from "./upload";
import { parseId } from "./users.routes";

const versionSchema = z.coerce
  .number({ error: "Send the roof version you loaded" })
  .int("Must be a whole number")
  .min(0, "Must be 0 or more");

/** UTF-8 text of the upload, or the reason it isn't a CSV. */
function csvText(buf: Buffer): string | RoofCsvError {
  try {
    const text = new TextDecoder("utf-8", { fatal: true }).decode(buf);
    if (text.includes("\u0000")) throw new Error("binary");
    return text;
  } catch {
    return { row: 1, column: "file", message: "This is not a CSV text file (save it from the spreadsheet as CSV UTF-8)" };
  }
}

/**
 * /api/jobs/:jobId/roof/import and /export.csv (mounted before the jobs router; other paths fall through).
 * The import is a preview unless `?commit=1`; a commit appends the planes to the roof as a new version
 * through RoofsService.save (the client's `version` form field; a stale one → 409), and saves nothing
 * when any row is bad (400 with the row errors).
 */
export function roofImportRouter(ctx: AppContext): Router {
  const jobs = new JobsService(ctx.sequelize);
  const roofs = new RoofsService(ctx.sequelize);
  const receive = receiveFiles({ field: "file", maxFiles: 1, maxBytes: ROOF_CSV_MAX_BYTES });
  const router = Router({ mergeParams: true });
  const jobIdOf = (req: Request) => parseId(String((req.params as { jobId?: string }).jobId), "Job");

  router.post("/import", requireAuth, requireRole("owner", "estimator"), async (req, res) => {
    const jobId = jobIdOf(req);
    await jobs.get(jobId, req.user!); // 404 before the body
    const [file] = await receive(req, res);
    if (!file) throw badRequest("Please check the highlighted fields", { file: "Choose a CSV file (.csv)" });
    const commit = req.query.commit === "1" || req.query.commit === "true";
    const version = commit ? versionSchema.safeParse((req.body as { version?: unknown } | undefined)?.version) : null;
    if (version && !version.success) {
      throw badRequest("Please check the highlighted fields", { version: version.error.issues[0]?.message ?? "Required" });
    }

    const roof = await roofs.get(jobId, req.user!);
    const stacks = roof.stacks.length ? roof.stacks : [defaultImportStack()];
    const defaultStackId = roof.stacks.length ? roof.defaultStackId : stacks[0]!.id;
    const text = csvText(file.buffer);
    const result =
      typeof text === "string"
        ? parseRoofCsv(text, {
            existingIds: roof.planes.map((p) => p.id),
            stackIds: stacks.map((s) => s.id),
            existingCount: roof.planes.length,
          })
        : { planes: [], rows: [], errors: [text] };

    const refuse = (errors: RoofCsvError[]) => {
      const n = new Set(errors.map((e) => e.row)).size;
      return new HttpError(400, "csv_invalid", `${n} ${n === 1 ? "row has" : "rows have"} problems; nothing was saved`, undefined, {
        errors,
        data: { planes: result.planes, rows: result.rows, errors, committed: false },
      });
    };

    if (!commit) {
      res.json({ data: { planes: result.planes, rows: result.rows, errors: result.errors, committed: false } });
      return;
    }
    if (result.errors.length) throw refuse(result.errors);

    let body;
    try {
      body = roofSaveSchema.parse({ planes: [...roof.planes, ...result.planes], stacks, defaultStackId, version: version!.data });
    } catch (err) {
      if (!(err instanceof ZodError)) throw err;
      // A cross-check on the whole roof (ids, stacks, geometry): name the imported row when it is one.
      const errors: RoofCsvError[] = err.issues.map((i) => {
        const index = i.path[0] === "planes" && typeof i.path[1] === "number" ? i.path[1] - roof.planes.length : -1;
        return { row: index >= 0 ? (result.rows[index] ?? 1) : 1, column: index >= 0 ? String(i.path[2] ?? "row") : "file", message: i.message };
      });
      throw refuse(errors);
    }
    const saved = await roofs.save(jobId, body, req.user!);
    res.json({ data: { planes: result.planes, rows: result.rows, errors: [], committed: true, roof: saved } });
  });

  router.get("/export.csv", requireAuth, async (req, res) => {
    const jobId = jobIdOf(req);
    const roof = await roofs.get(jobId, req.user!);
    res.set({
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="job-${jobId}-roof-planes.csv"`,
      "Cache-Control": "no-store",
      "X-Content-Type-Options": "nosniff",
    });
    res.send(`\uFEFF${roofToCsv(roof.planes)}`); // the byte-order mark makes spreadsheet programs read UTF-8
  });

  return router;
}
