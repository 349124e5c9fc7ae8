import { Router } from "express";
import type { Sequelize } from "sequelize";

/** `GET /api/health`: 200 with the database up, 503 when it does not answer within 2 s. */
export function healthRouter(sequelize: Sequelize): Router {
  const router = Router();
  router.get("/", async (_req, res) => {
    let timer: NodeJS.Timeout | undefined;
    try {
      await Promise.race([
        sequelize.query("SELECT 1"),
        new Promise((_, reject) => {
          timer = setTimeout(() => reject(new Error("timeout")), 2_000);
        }),
      ]);
      res.json({ status: "ok", db: "up" });
    } catch {
      res.status(503).json({ status: "degraded", db: "down" });
    } finally {
      clearTimeout(timer);
    }
  });
  return router;
}
