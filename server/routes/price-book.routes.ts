import { Router } from "express";
import multer from "multer";
import type { AppContext } from "../app";
import {
  PRICE_BOOK_CSV_MAX_BYTES,
  catalogItemInputSchema,
  catalogItemListQuerySchema,
  catalogItemUpdateSchema,
  laborRatesInputSchema,
  pricingSettingsSchema,
} from "../../shared/schemas/price-book";
import { requireRole } from "../middleware/require-auth";
import { HttpError, badRequest } from "../errors";
import { PriceBookService } from "../services/price-book.service";
import { rulesBuildForCompany } from "../services/price-book-rules";
import { presentCatalogItem, presentCatalogItemPrice, presentLaborRate } from "../presenters/price-book.presenter";
import { requireBody } from "./auth.routes";
import { parseId } from "./users.routes";

const CSV_TYPES = new Set(["text/csv", "application/csv", "text/plain", "application/vnd.ms-excel", "application/octet-stream", "text/comma-separated-values"]);

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: PRICE_BOOK_CSV_MAX_BYTES, files: 1, fields: 10 },
  fileFilter: (_req, file, cb) => {
    if (CSV_TYPES.has(file.mimetype) || /\.csv$/i.test(file.originalname)) return cb(null, true);
    cb(badRequest("Please check the highlighted fields", { file: "Choose a CSV file (.csv)" }));
  },
});

/**
 * /api/price-book: owners edit; owners and estimators read; crew get 403 on every route, anonymous 401.
 * The role check comes first, then the company (404), then the body (400).
 */
export function priceBookRouter(ctx: AppContext): Router {
  const svc = new PriceBookService(ctx.sequelize);
  const router = Router();
  const owner = requireRole("owner");
  router.use(requireRole("owner", "estimator"));

  router.get("/items", async (req, res) => {
    const query = catalogItemListQuerySchema.parse(req.query);
    const rows = await svc.listItems(query, req.user!);
    res.json({ data: rows.map(presentCatalogItem), meta: { page: 1, pageSize: rows.length, total: rows.length } });
  });

  router.post("/items", owner, async (req, res) => {
    const input = catalogItemInputSchema.parse(requireBody(req));
    const item = await svc.createItem(input, req.user!);
    res.status(201).json({ data: presentCatalogItem(item) });
  });

  router.get("/items/:id", async (req, res) => {
    const item = await svc.getItem(parseId(String(req.params.id), "Item"), req.user!);
    res.json({ data: presentCatalogItem(item) });
  });

  router.get("/items/:id/prices", async (req, res) => {
    const rows = await svc.priceHistory(parseId(String(req.params.id), "Item"), req.user!);
    res.json({ data: rows.map(presentCatalogItemPrice) });
  });

  router.patch("/items/:id", owner, async (req, res) => {
    const id = parseId(String(req.params.id), "Item");
    await svc.getItem(id, req.user!); // another company's id: 404 before the body is looked at
    const input = catalogItemUpdateSchema.parse(requireBody(req));
    const item = await svc.updateItem(id, input, req.user!);
    res.json({ data: presentCatalogItem(item) });
  });

  router.post("/items/:id/archive", owner, async (req, res) => {
    const item = await svc.setActive(parseId(String(req.params.id), "Item"), false, req.user!);
    res.json({ data: presentCatalogItem(item) });
  });

  router.post("/items/:id/restore", owner, async (req, res) => {
    const item = await svc.setActive(parseId(String(req.params.id), "Item"), true, req.user!);
    res.json({ data: presentCatalogItem(item) });
  });

  router.get("/labor", async (req, res) => {
    const rows = await svc.listLabor(req.user!);
    res.json({ data: rows.map(presentLaborRate) });
  });

  router.put("/labor", owner, async (req, res) => {
    const input = laborRatesInputSchema.parse(requireBody(req));
    const rows = await svc.replaceLabor(input, req.user!);
    res.json({ data: rows.map(presentLaborRate) });
  });

  router.get("/settings", async (req, res) => {
    res.json({ data: await svc.getSettings(req.user!) });
  });

  router.put("/settings", owner, async (req, res) => {
    const input = pricingSettingsSchema.parse(requireBody(req));
    res.json({ data: await svc.putSettings(input, req.user!) });
  });

  router.get("/mapping", async (req, res) => {
    const { data, conflicts } = await svc.mapping(req.user!);
    res.json({ data, conflicts });
  });

  /** The engine's `rules` from this price book (the browser preview computes with the same rules as the server). */
  router.get("/rules", async (req, res) => {
    const build = await rulesBuildForCompany(req.user!.companyId);
    res.json({ data: build.rules, sources: build.sources, conflicts: build.conflicts });
  });

  router.get("/export.csv", async (req, res) => {
    const csv = await svc.exportCsv(req.user!);
    const date = new Date().toISOString().slice(0, 10);
    res.set("Content-Type", "text/csv; charset=utf-8");
    res.set("Content-Disposition", `attachment; filename="price-book-${date}.csv"`);
    res.set("Cache-Control", "no-store");
    res.send(`\uFEFF${csv}`); // the byte-order mark makes spreadsheet programs read the file as UTF-8
  });

  /** Multipart, field `file`. Without `?commit=1` a preview; with it, saved only when every row is valid. */
  router.post("/import", owner, upload.single("file"), async (req, res) => {
    if (!req.file) throw badRequest("Please check the highlighted fields", { file: "Choose a CSV file (.csv)" });
    const commit = req.query.commit === "1" || req.query.commit === "true";
    const result = await svc.importCsv(req.file.buffer, commit, req.user!);
    if (commit && !result.valid) {
      const n = new Set(result.errors.map((e) => e.row)).size;
      throw new HttpError(
        400,
        "csv_invalid",
        `${n} ${n === 1 ? "row has" : "rows have"} problems; nothing was saved`,
        undefined,
        { errors: result.errors, data: result },
      );
    }
    res.json({ data: result });
  });

  return router;
}
