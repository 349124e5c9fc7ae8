/**
 * Times the proposal PDF: the median time to build a three-page proposal with Inter (fonts parsed once,
 * reused) and, in the same run, the same pages in PDF's built-in Helvetica, with the ratio. Target: Inter
 * under 150 ms. Then one render through the worker pool (TypeScript worker started under tsx).
 * Run: `npm run bench:pdf` (tsx scripts/bench-pdf.ts [runs]).
 */
import { performance } from "node:perf_hooks";
import { z } from "zod";
import { buildProposalDoc } from "../server/services/proposal-content";
import { renderProposalPdf } from "../server/pdf/proposal-pdf";
import { helveticaFonts, loadInterFonts, type FontFamily } from "../server/pdf/fonts";
import { closePdfWorkers, pdfWorkerPool, renderProposalPdfInWorker } from "../server/pdf/pdf-worker";
import { proposalInput } from "../tests/helpers/proposal-fixtures";
import type { ProposalDocDto } from "../shared/schemas/proposal";

const [runs] = z.tuple([z.coerce.number().int().min(3).max(1000).default(40)]).parse([process.argv[2]]);

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const pageCount = (pdf: Buffer) => (pdf.toString("latin1").match(/\/Type \/Page\b/g) ?? []).length;

/**
 * A three-page proposal: the demo roof with two options, the scope trimmed to the main area's first
 * layers and the fixed texts shortened so the whole document (header, scope, plan, options, terms,
 * safety box, acceptance) lands on three pages.
 */
function threePageDoc(): ProposalDocDto {
  const doc = buildProposalDoc(proposalInput({ optionCount: 2 }));
  const area = { ...doc.scope.areas[0], layers: doc.scope.areas[0].layers.slice(0, 3) };
  return {
    ...doc,
    scope: { ...doc.scope, preparation: doc.scope.preparation.slice(0, 1), areas: [area] },
    exclusions: doc.exclusions.slice(0, 2),
    warranty: doc.warranty.slice(0, 1),
    paymentTerms: doc.paymentTerms.slice(0, 2),
  };
}

async function time(doc: ProposalDocDto, fonts: FontFamily) {
  for (let i = 0; i < 5; i++) await renderProposalPdf(doc, { fonts }); // warm-up (JIT, shaped words)
  const times: number[] = [];
  const cpu: number[] = [];
  let pdf: Buffer = Buffer.alloc(0);
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    pdf = await renderProposalPdf(doc, { fonts });
    times.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  return { medianMs: median(times), minMs: Math.min(...times), cpuMs: median(cpu), pages: pageCount(pdf), bytes: pdf.length };
}

async function main() {
  const doc = threePageDoc();
  const t0 = performance.now();
  const inter = loadInterFonts();
  const parseMs = performance.now() - t0;
  const i = await time(doc, inter);
  const h = await time(doc, helveticaFonts());
  const w0 = performance.now();
  await pdfWorkerPool().warm();
  const warmMs = performance.now() - w0;
  const w1 = performance.now();
  const viaWorker = await renderProposalPdfInWorker(doc);
  const workerMs = performance.now() - w1;
  await closePdfWorkers();
  const ratio = i.medianMs / h.medianMs;
  console.log(`Fonts parsed once (Inter, 7 subsets × 3 weights): ${parseMs.toFixed(0)} ms`);
  console.log(`Inter:     median ${i.medianMs.toFixed(1)} ms (min ${i.minMs.toFixed(1)}, CPU median ${i.cpuMs.toFixed(1)}), ${i.pages} pages, ${i.bytes} bytes, ${runs} runs`);
  console.log(`Helvetica: median ${h.medianMs.toFixed(1)} ms (min ${h.minMs.toFixed(1)}, CPU median ${h.cpuMs.toFixed(1)}), ${h.pages} pages, ${h.bytes} bytes`);
  console.log(`Ratio Inter / Helvetica: ${ratio.toFixed(2)}`);
  console.log(`Worker (tsx): pool start ${warmMs.toFixed(0)} ms, first render ${workerMs.toFixed(0)} ms, ${pageCount(viaWorker)} pages, ${viaWorker.length} bytes`);
  console.log(i.medianMs < 150 ? "PASS: under the 150 ms target" : "OVER the 150 ms target");
  if (i.pages !== 3) console.log(`note: the benchmark document has ${i.pages} pages, not 3`);
}

await main();
