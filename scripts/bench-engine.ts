/**
 * Times the roof takeoff on a generated 100-plane roof: warm-up, then 200 runs; prints the median.
 * Target: under 5 ms per takeoff. Run: `npm run bench:engine` (tsx scripts/bench-engine.ts [planes] [runs]).
 */
import { performance } from "node:perf_hooks";
import { z } from "zod";
import { computeTakeoff } from "../shared/engine/takeoff";
import { buildBenchRoof } from "../shared/engine/roof/bench-roof";

const args = z
  .tuple([z.coerce.number().int().min(1).max(500).default(100), z.coerce.number().int().min(1).max(10_000).default(200)])
  .parse([process.argv[2], process.argv[3]]);
const [planeCount, runs] = args;

export function benchEngine(planes = planeCount, n = runs) {
  const input = buildBenchRoof(planes);
  const first = computeTakeoff(input);
  if (!first.ok) throw new Error(`bench roof refused: ${first.reason} at ${first.path.join(".")}`);
  for (let i = 0; i < 30; i++) computeTakeoff(input); // warm-up
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    computeTakeoff(input);
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

const r = benchEngine();
console.log(`engine takeoff, ${r.planes} planes (${r.panels} panels, ${r.squares.toFixed(0)} squares), ${r.runs} runs: median ${r.medianMs.toFixed(2)} ms (p95 ${r.p95Ms.toFixed(2)} ms, min ${r.minMs.toFixed(2)} ms); target < 5 ms`);
