/**
 * Proposal test worlds: a company with the demo price book, its people signed in, a job with a roof and an
 * approved quote (two options), plus helpers to send it and read the link out of the outbox.
 */
import request, { type Response } from "supertest";
import type { Express } from "express";
import { OutboxMessage } from "../../server/models/mail.models";
import { post, quoteInReview, quoteWorld } from "./quote-factories";

export type ProposalWorld = Awaited<ReturnType<typeof quoteWorld>> & { quoteId: number; quote: QuoteDetail };

interface QuoteDetail {
  id: number;
  number: string;
  revision: { options: Array<{ id: number; label: string; totals: { totalCents: number; depositCents: number; priceCents: number; taxCents: number } }> };
}

export const TWO_OPTIONS = [
  { label: "Battens + foil", spec: { spacer: "battens", foil: true } },
  { label: "No spacer", spec: { spacer: "none", foil: false } },
];

/** A world with an approved quote of two options. */
export async function approvedQuoteWorld(opts: { app?: Express } = {}): Promise<ProposalWorld> {
  const w = await quoteWorld(opts);
  const q = await quoteInReview(w, { options: TWO_OPTIONS });
  const res = await post(w.owner, `/api/quotes/${q.id}/approve`, {});
  if (res.status !== 200) throw new Error(`approve failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { ...w, quoteId: q.id, quote: res.body.data };
}

/** The private link's token from the newest proposal e-mail in the outbox. */
export async function latestToken(kind = "proposal"): Promise<string> {
  const row = await OutboxMessage.findOne({ where: { kind }, order: [["id", "DESC"]] });
  const m = row ? /\/p\/([A-Za-z0-9_-]{43})/.exec(row.text) : null;
  if (!m) throw new Error("no proposal link in the outbox");
  return m[1];
}

/** Sends the world's quote as its estimator; returns the response and the new link's token. */
export async function sendQuote(w: ProposalWorld, body: Record<string, unknown> = {}) {
  const res = await post(w.estimator, `/api/quotes/${w.quoteId}/send`, body);
  if (res.status !== 201) throw new Error(`send failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { res, token: await latestToken() };
}

/** An anonymous client of the same app (the homeowner). */
export const homeowner = (app: Express) => request(app);

/** supertest parser that keeps a binary body (PDF bytes) as a Buffer. */
export const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on("data", (c: Buffer) => chunks.push(c));
  res.on("end", () => cb(null, Buffer.concat(chunks)));
};
