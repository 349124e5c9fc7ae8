/**
 * Times the roof takeoff on a generated 100-plane roof: 2 s of warm-up, then 200 runs; prints the median.
 * Target: under 5 ms per takeoff. Then, in the same run, the HTTP round trip of POST /api/calc/takeoff
 * against an authenticated echo of the same payload (POST /api/calc/echo) on the real app and a
 * throwaway benchmark database: targets ratio ≤ 2 and the takeoff round trip under 100 ms.
 * The route answers each plane's quantities unless asked for the full detail (?detail=full); the round trip is
 * timed both ways, and the server's Server-Timing header splits it: the engine's time there and serialising.
 * Run: `npm run bench:engine` (tsx scripts/bench-engine.ts [planes] [runs]).
 */
import { performance } from "node:perf_hooks";
import { z } from "zod";
import { computeTakeoff, computeTakeoffQuantities } from "../shared/engine/takeoff";
import { buildBenchRoof } from "../shared/engine/roof/bench-roof";

const args = z
  .tuple([z.coerce.number().int().min(1).max(500).default(100), z.coerce.number().int().min(1).max(10_000).default(200)])
  .parse([process.argv[2], process.argv[3]]);
const [planeCount, runs] = args;
const WARM_UP_MS = 2_000;
const RT_WARM_UP_MS = 3_000;

/** `compute`: the full takeoff (each plane's whole detail, as the app's screens use) or the quantities only. */
export function benchEngine(planes = planeCount, n = runs, compute: (input: unknown) => ReturnType<typeof computeTakeoff> | ReturnType<typeof computeTakeoffQuantities> = computeTakeoff) {
  const input = buildBenchRoof(planes);
  const first = compute(input);
  if (!first.ok) throw new Error(`bench roof refused: ${first.reason} at ${first.path.join(".")}`);
  // Warm-up until the optimising compiler is done (as in a server that has been up a few seconds): at least 30
  // runs and 2 s. The optimised code of the takeoff takes V8 a few hundred milliseconds to build in the
  // background, and runs timed before it is ready measure the interpreter, not the engine.
  for (let i = 0, t0 = performance.now(); i < 30 || performance.now() - t0 < WARM_UP_MS; i++) compute(input);
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    compute(input);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const median = times.length % 2 ? times[(times.length - 1) / 2] : (times[times.length / 2 - 1] + times[times.length / 2]) / 2;
  const t = first.result.totals;
  return {
    planes: first.result.planes.length,
    panels: t.panelCount,
    squares: t.squares,
    runs: n,
    medianMs: median,
    p95Ms: times[Math.floor(0.95 * (times.length - 1))],
    minMs: times[0],
  };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/** Sequential round trips (one at a time, keep-alive) of the same payload, interleaved: the takeoff with each
 * plane's quantities (the default), the takeoff with each plane's whole detail, and the echo. */
async function benchRoundTrip(planes: number, n: number) {
  // Loaded only now: the engine is timed first in a process that holds nothing else (see below).
  const { startBenchServer } = await import("./lib/bench-server");
  const server = await startBenchServer();
  try {
    const body = JSON.stringify(buildBenchRoof(planes));
    const answerBytes: Record<string, number> = {};
    // The server's own split of a takeoff (its Server-Timing header): the engine with the input check, and
    // serialising the answer.
    const inServer: Record<string, { engine: number[]; json: number[] }> = {};
    const post = async (path: string) => {
      const t0 = performance.now();
      const res = await fetch(server.url + path, { method: "POST", headers: server.headers, body });
      const answer = await res.arrayBuffer();
      const ms = performance.now() - t0;
      if (res.status !== 200) throw new Error(`${path} answered ${res.status}`);
      answerBytes[path] = answer.byteLength;
      const timing = serverTiming(res.headers.get("server-timing"));
      if (timing) {
        const t = (inServer[path] ??= { engine: [], json: [] });
        t.engine.push(timing.engine);
        t.json.push(timing.json);
      }
      return ms;
    };
    const routes = ["/api/calc/takeoff", "/api/calc/takeoff?detail=full", "/api/calc/echo"];
    // Warm-up until the server's own code (Express, the session lookup, the routes) is optimised as in a server
    // that has been up a while: at least 3 s of rounds. With only a few dozen requests the echo is still partly
    // interpreted and slower than in steady state, which would flatter the ratio.
    for (let i = 0, t0 = performance.now(); i < 50 || performance.now() - t0 < RT_WARM_UP_MS; i++) for (const r of routes) await post(r);
    const times: number[][] = routes.map(() => []);
    for (const t of Object.values(inServer)) t.engine.length = t.json.length = 0; // the warm-up's do not count
    for (let i = 0; i < n; i++) for (let k = 0; k < routes.length; k++) times[k].push(await post(routes[k]));
    const [takeoffMs, fullMs, echoMs] = times.map(median);
    const kb = (path: string) => Math.round(answerBytes[path] / 1024);
    const split = (path: string) => ({ engineMs: median(inServer[path].engine), jsonMs: median(inServer[path].json) });
    return { bytes: body.length, takeoffMs, fullMs, echoMs, takeoffKb: kb(routes[0]), fullKb: kb(routes[1]), runs: n, takeoffSplit: split(routes[0]), fullSplit: split(routes[1]) };
  } finally {
    await server.close();
  }
}

/** The `engine` and `json` durations of a Server-Timing header (see server/routes/calc.routes.ts), or null. */
function serverTiming(header: string | null): { engine: number; json: number } | null {
  const dur = (name: string) => Number(new RegExp(`(?:^|,)\\s*${name};dur=([0-9.]+)`).exec(header ?? "")?.[1] ?? NaN);
  const engine = dur("engine");
  const json = dur("json");
  return Number.isFinite(engine) && Number.isFinite(json) ? { engine, json } : null;
}

const line = (r: ReturnType<typeof benchEngine>) =>
  `${r.planes} planes (${r.panels} panels, ${r.squares.toFixed(0)} squares), ${r.runs} runs: median ${r.medianMs.toFixed(2)} ms (p95 ${r.p95Ms.toFixed(2)} ms, min ${r.minMs.toFixed(2)} ms)`;
// The engine alone (the pure module, nothing else loaded), which is what the target is about …
console.log(`engine takeoff, ${line(benchEngine())}; target < 5 ms`);
console.log(`engine takeoff, each plane's quantities only (what POST /api/calc/takeoff answers by default), ${line(benchEngine(planeCount, runs, computeTakeoffQuantities))}`);
const rt = await benchRoundTrip(planeCount, Math.min(runs, 100));
// … and again in this process now that it also holds the whole server (Express, Sequelize, the PDF and mail
// libraries): a bigger heap makes each young-generation collection cost more, as in the server itself.
console.log(`engine takeoff in a process that holds the server, ${line(benchEngine())}`);
console.log(
  `HTTP round trip, ${planeCount}-plane roof (${(rt.bytes / 1024).toFixed(0)} KB JSON), ${rt.runs} runs each: ` +
    `POST /api/calc/takeoff (${rt.takeoffKb} KB answer) median ${rt.takeoffMs.toFixed(2)} ms, authenticated echo ${rt.echoMs.toFixed(2)} ms, ` +
    `ratio ${(rt.takeoffMs / rt.echoMs).toFixed(2)}; targets: ratio ≤ 2, round trip < 100 ms`,
);
console.log(
  `  with each plane's whole detail (?detail=full, ${rt.fullKb} KB answer): median ${rt.fullMs.toFixed(2)} ms, ratio ${(rt.fullMs / rt.echoMs).toFixed(2)}`,
);
const splitText = (s: { engineMs: number; jsonMs: number }) => `engine with the input check ${s.engineMs.toFixed(2)} ms, serialising the answer ${s.jsonMs.toFixed(2)} ms`;
console.log(`  inside the server (its Server-Timing header, medians): default answer: ${splitText(rt.takeoffSplit)}; whole detail: ${splitText(rt.fullSplit)}`);
