/**
 * The homeowner's page talks to the public proposal routes with plain `fetch`: no session, no CSRF token
 * (the token in the URL is the credential), so the page works the same whether or not anyone is signed in.
 */
import type { PublicProposalDto, PublicProposalOption } from "@shared/schemas/proposal-api";
import { ApiError, apiErrorFrom } from "@/lib/api-client";

export type PublicOption = PublicProposalOption;
export type PublicProposal = PublicProposalDto;
export type DepositState = NonNullable<PublicProposalDto["deposit"]> & { paidAt?: string | null };

export type AcceptInput = { optionId: number; signerName: string; consent: true };

const base = (token: string) => `/api/proposals/${encodeURIComponent(token)}`;

async function call<T>(url: string, init: { method?: "GET" | "POST"; json?: unknown; signal?: AbortSignal } = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method: init.method ?? "GET",
      headers: init.json === undefined ? { Accept: "application/json" } : { Accept: "application/json", "Content-Type": "application/json" },
      body: init.json === undefined ? undefined : JSON.stringify(init.json),
      credentials: "omit",
      signal: init.signal,
    });
  } catch (err) {
    if (init.signal?.aborted) throw err;
    throw new ApiError(0, "network", "Can't reach the server. Check your connection and try again.");
  }
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (!res.ok) throw apiErrorFrom(res.status, body);
  return body as T;
}

export const publicProposalApi = {
  get: (token: string, signal?: AbortSignal) =>
    call<{ data: PublicProposal }>(base(token), { signal }).then((r) => r.data),
  accept: (token: string, input: AcceptInput) => call<unknown>(`${base(token)}/accept`, { method: "POST", json: input }),
  decline: (token: string, reason: string) => call<unknown>(`${base(token)}/decline`, { method: "POST", json: { reason } }),
  /** The payment page's address (`{ url }`; a `{ data: { url } }` envelope is read too). */
  deposit: (token: string) =>
    call<{ url?: string; data?: { url?: string } }>(`${base(token)}/deposit`, { method: "POST", json: {} }).then((r) => {
      const url = r?.url ?? r?.data?.url;
      if (!url) throw new ApiError(500, "no_url", "The payment page could not be opened. Try again in a moment.");
      return url;
    }),
  pdfUrl: (token: string) => `${base(token)}/pdf`,
};
