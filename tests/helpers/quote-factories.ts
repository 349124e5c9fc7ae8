import type { Express } from "express";
import { createTestApp } from "./app";
import { signedInAgent } from "./auth";
import { buildCompany } from "./factories";
import { testSequelize } from "./db";
import { buildJob, roofBody, saveRoofFor } from "./job-factories";
import { seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import type { QuoteCreateInput } from "../../shared/schemas/quote";

export type Agent = Awaited<ReturnType<typeof signedInAgent>>;

/**
 * A company with the demo price book (margin mode, 35 % target, 25 % minimum, 7 % tax on cost, 30 %
 * deposit), an owner, an estimator and a crew member signed in on one app, and a job with a saved roof.
 */
export async function quoteWorld(opts: { app?: Express } = {}) {
  const app = opts.app ?? createTestApp();
  const company = await buildCompany();
  await seedDemoPriceBook(testSequelize(), company.id);
  const owner = await signedInAgent({ role: "owner", companyId: company.id }, app);
  const estimator = await signedInAgent({ role: "estimator", companyId: company.id }, app);
  const crew = await signedInAgent({ role: "crew", companyId: company.id }, app);
  const job = await buildJob({ companyId: company.id, status: "estimating", estimatorId: estimator.user.id });
  await saveRoofFor(job, roofBody(0));
  return { app, company, owner, estimator, crew, job };
}

export async function createQuote(a: Agent, jobId: number, body: QuoteCreateInput | Record<string, unknown> = {}) {
  return a.agent.post(`/api/jobs/${jobId}/quotes`).set("X-CSRF-Token", a.token).send(body);
}

export const post = (a: Agent, path: string, body?: unknown) => {
  const r = a.agent.post(path).set("X-CSRF-Token", a.token);
  return body === undefined ? r : r.send(body as object);
};

export const patch = (a: Agent, path: string, body: unknown) => a.agent.patch(path).set("X-CSRF-Token", a.token).send(body as object);

/** Creates a quote as the estimator and submits it; returns the quote detail after the submit. */
export async function quoteInReview(w: Awaited<ReturnType<typeof quoteWorld>>, body: QuoteCreateInput | Record<string, unknown> = {}) {
  const created = await createQuote(w.estimator, w.job.id, body);
  if (created.status !== 201) throw new Error(`create failed: ${created.status} ${JSON.stringify(created.body)}`);
  const q = created.body.data;
  const sub = await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: q.revision.version });
  if (sub.status !== 200) throw new Error(`submit failed: ${sub.status} ${JSON.stringify(sub.body)}`);
  return sub.body.data;
}
