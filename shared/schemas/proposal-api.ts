/**
 * The proposal and deposit API: request bodies (shared by the client forms and the server routes) and the
 * shapes the routes return. The document itself is ProposalDocDto (./proposal).
 */
import { z } from "zod";
import type { ProposalDocDto } from "./proposal";

export const PROPOSAL_LINK_STATUSES = ["active", "revoked", "accepted", "declined", "expired"] as const;
export type ProposalLinkStatus = (typeof PROPOSAL_LINK_STATUSES)[number];
export const DEPOSIT_STATUSES = ["pending", "paid", "failed", "expired"] as const;
export type DepositStatus = (typeof DEPOSIT_STATUSES)[number];

/** POST /api/quotes/:id/send */
export const proposalSendSchema = z.object({
  /** Defaults to the customer's e-mail. */
  to: z.string().trim().email("Enter an e-mail address").max(320).optional(),
  copyToMe: z.boolean().optional(),
  /** A short note above the proposal in the e-mail. */
  message: z.string().trim().max(2_000).optional(),
});
export type ProposalSendInput = z.infer<typeof proposalSendSchema>;

/** POST /api/proposals/:token/accept */
export const proposalAcceptSchema = z.object({
  optionId: z.coerce.number().int().positive(),
  signerName: z.string().trim().min(2, "Type your full name").max(200),
  consent: z.literal(true, { error: "Tick the box to agree" }),
});
export type ProposalAcceptInput = z.infer<typeof proposalAcceptSchema>;

/** POST /api/proposals/:token/decline */
export const proposalDeclineSchema = z.object({
  reason: z.string().trim().max(2_000).optional().default(""),
});
export type ProposalDeclineInput = z.infer<typeof proposalDeclineSchema>;

export interface DepositDto {
  status: DepositStatus;
  amountCents: number;
  paidAt: string | null;
}

/** GET /api/jobs/:id/proposals and POST /api/quotes/:id/send. */
export interface ProposalDto {
  id: number;
  quoteId: number;
  revisionNo: number;
  status: ProposalLinkStatus;
  sentTo: string;
  sentAt: string;
  expiresAt: string;
  viewedAt: string | null;
  acceptedAt: string | null;
  acceptedOptionId: number | null;
  acceptedOptionLabel: string | null;
  signerName: string | null;
  declinedAt: string | null;
  declineReason: string | null;
  deposit: DepositDto | null;
}

/** The jobs board and the job header: the latest proposal's progress. */
export const jobProposalProgressSchema = z.object({
  status: z.enum(PROPOSAL_LINK_STATUSES),
  sentAt: z.string(),
  viewedAt: z.string().nullable(),
  acceptedAt: z.string().nullable(),
  declinedAt: z.string().nullable(),
  depositStatus: z.enum(DEPOSIT_STATUSES).nullable(),
});
export type JobProposalProgress = z.infer<typeof jobProposalProgressSchema>;

export interface PublicProposalOption {
  id: number;
  label: string;
  totalCents: number;
  depositCents: number;
  priceCents: number;
  taxCents: number;
}

/** GET /api/proposals/:token */
export interface PublicProposalDto {
  status: ProposalLinkStatus;
  expiresAt: string;
  doc: ProposalDocDto;
  options: PublicProposalOption[];
  accepted: { at: string; optionId: number; optionLabel: string; signerName: string } | null;
  declined: { at: string; reason: string | null } | null;
  deposit: { status: DepositStatus; amountCents: number } | null;
}
