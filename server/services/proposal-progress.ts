/** The jobs board and the job header: the latest proposal of each job, with its deposit's state. */
import { QueryTypes, type Transaction } from "sequelize";
import type { JobProposalProgress } from "../../shared/schemas/proposal-api";
import { Proposal } from "../models/index";
import { isoText } from "../db/sql";

/**
 * For a query over `jobs j`: the columns of the job's latest proposal and its deposit state (a paid payment
 * wins; otherwise the newest), read with `PROGRESS_JOIN` and turned into the API's shape by `progressOf`.
 */
export const PROGRESS_COLUMNS = `pr.status AS proposalStatus, ${isoText("pr.created_at")} AS proposalSentAt,
  ${isoText("pr.viewed_at")} AS proposalViewedAt, ${isoText("pr.accepted_at")} AS proposalAcceptedAt,
  ${isoText("pr.declined_at")} AS proposalDeclinedAt,
  (SELECT pay.status FROM payments pay WHERE pay.proposal_id = pr.id
    ORDER BY pay.status = 'paid' DESC, pay.id DESC LIMIT 1) AS depositStatus`;

export const PROGRESS_JOIN = `LEFT JOIN proposals pr ON pr.id =
  (SELECT MAX(p2.id) FROM proposals p2 WHERE p2.company_id = j.company_id AND p2.job_id = j.id)`;

export interface ProgressColumns {
  proposalStatus: JobProposalProgress["status"] | null;
  proposalSentAt: string | null;
  proposalViewedAt: string | null;
  proposalAcceptedAt: string | null;
  proposalDeclinedAt: string | null;
  depositStatus: JobProposalProgress["depositStatus"];
}

export function progressOf(r: ProgressColumns): JobProposalProgress | null {
  if (r.proposalStatus === null) return null;
  return {
    status: r.proposalStatus,
    sentAt: r.proposalSentAt!,
    viewedAt: r.proposalViewedAt,
    acceptedAt: r.proposalAcceptedAt,
    declinedAt: r.proposalDeclinedAt,
    depositStatus: r.depositStatus ?? null,
  };
}

/** The given jobs' progress, in one query (jobs without a proposal are left out of the map). */
export async function proposalProgressFor(jobIds: number[], t?: Transaction): Promise<Map<number, JobProposalProgress>> {
  const out = new Map<number, JobProposalProgress>();
  const ids = [...new Set(jobIds.map(Number).filter((n) => Number.isInteger(n) && n > 0))];
  if (ids.length === 0) return out;
  const rows = await Proposal.sequelize!.query<ProgressColumns & { jobId: number }>(
    `SELECT j.id AS jobId, ${PROGRESS_COLUMNS} FROM jobs j ${PROGRESS_JOIN} WHERE j.id IN (${ids.join(",")})`,
    { type: QueryTypes.SELECT, transaction: t },
  );
  for (const r of rows) {
    const progress = progressOf(r);
    if (progress) out.set(Number(r.jobId), progress);
  }
  return out;
}
