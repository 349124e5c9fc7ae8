import { Router } from "express";
import { computeTakeoff, computeTakeoffQuantities } from "../../shared/engine/takeoff";
import { computeGapStudy } from "../../shared/engine/gap-study";
import { calcQuerySchema } from "../../shared/schemas/takeoff";
import { HttpError } from "../errors";
import { requireAuth } from "../middleware/require-auth";
import { requireBody } from "./auth.routes";

type Refusal = { reason: string; path: (string | number)[]; fields?: Record<string, string> };

/** The engine's refusal as the API's 400: the message and every field path it names. */
export function engineRefusal(r: Refusal): HttpError {
  const fields = r.fields ?? { [r.path.map(String).join(".") || "body"]: r.reason };
  return new HttpError(400, "bad_request", r.reason, fields);
}

/**
 * Stateless calculations for previews and integrations: the same engine the stored jobs use.
 * Any signed-in role may call them; the results hold quantities, never prices. Each plane carries its
 * quantities unless `?detail=full` asks for its whole detail (the roof-wide figures are the same either way).
 */
export function calcRouter(): Router {
  const router = Router();
  router.use(requireAuth);

  router.post("/takeoff", (req, res) => {
    const { detail } = calcQuerySchema.parse(req.query);
    const body = requireBody(req);
    const outcome = detail === "full" ? computeTakeoff(body) : computeTakeoffQuantities(body);
    if (!outcome.ok) throw engineRefusal(outcome);
    res.json({ data: outcome.result });
  });

  /** Returns the body as received: the transport and session cost of a calculation, for benchmarks. */
  router.post("/echo", (req, res) => {
    res.json({ data: requireBody(req) });
  });

  router.post("/gap-study", (req, res) => {
    const { detail } = calcQuerySchema.parse(req.query);
    const outcome = computeGapStudy(requireBody(req), detail);
    if (!outcome.ok) throw engineRefusal(outcome);
    res.json({ data: { options: outcome.options } });
  });

  return router;
}
