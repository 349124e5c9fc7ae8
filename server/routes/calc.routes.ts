import { Router, type Response } from "express";
import { performance } from "node:perf_hooks";
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
 * Sends a calculation's answer as JSON with a Server-Timing header (W3C Server Timing) naming the engine's time
 * (`engine`: the input check and the computation) and the answer's serialisation (`json`), in milliseconds. Browser
 * developer tools show it beside the request; `npm run bench:engine` reads it to split the round trip.
 */
function sendTimed(res: Response, body: unknown, startedAt: number, computedAt: number): void {
  const json = JSON.stringify(body);
  const serialisedAt = performance.now();
  res.set("Server-Timing", `engine;dur=${(computedAt - startedAt).toFixed(3)}, json;dur=${(serialisedAt - computedAt).toFixed(3)}`);
  res.type("json").send(json);
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
    const startedAt = performance.now();
    const outcome = detail === "full" ? computeTakeoff(body) : computeTakeoffQuantities(body);
    const computedAt = performance.now();
    if (!outcome.ok) throw engineRefusal(outcome);
    sendTimed(res, { data: outcome.result }, startedAt, computedAt);
  });

  /** Returns the body as received: the transport and session cost of a calculation, for benchmarks. */
  router.post("/echo", (req, res) => {
    res.json({ data: requireBody(req) });
  });

  router.post("/gap-study", (req, res) => {
    const { detail } = calcQuerySchema.parse(req.query);
    const body = requireBody(req);
    const startedAt = performance.now();
    const outcome = computeGapStudy(body, detail);
    const computedAt = performance.now();
    if (!outcome.ok) throw engineRefusal(outcome);
    sendTimed(res, { data: { options: outcome.options } }, startedAt, computedAt);
  });

  return router;
}
