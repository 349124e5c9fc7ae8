/** The jobs board and the job header: the latest proposal of each job, with its deposit's state. */
import { Op, literal, type Transaction } from "sequelize";
import type { DepositDto, JobProposalProgress } from "../../shared/schemas/proposal-api";
import { Payment, Proposal } from "../models/index";

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/** A paid row wins; otherwise the newest. */
function pick(current: DepositDto | undefined, p: Payment): DepositDto {
  if (current?.status === "paid") return current;
  return { status: p.status, amountCents: Number(p.amountCents), paidAt: iso(p.paidAt) };
}

/** One query for the page's job ids (their latest proposals) and one for those proposals' deposits. */
export async function proposalProgressFor(jobIds: number[], t?: Transaction): Promise<Map<number, JobProposalProgress>> {
  const out = new Map<number, JobProposalProgress>();
  const ids = [...new Set(jobIds.map(Number).filter((n) => Number.isInteger(n) && n > 0))];
  if (ids.length === 0) return out;
  const rows = await Proposal.findAll({
    where: { id: { [Op.in]: literal(`(SELECT MAX(p2.id) FROM proposals p2 WHERE p2.job_id IN (${ids.join(",")}) GROUP BY p2.job_id)`) } },
    attributes: ["id", "jobId", "status", "createdAt", "viewedAt", "acceptedAt", "declinedAt"],
    transaction: t,
  });
  const payments = rows.length
    ? await Payment.findAll({ where: { proposalId: rows.map((r) => r.id) }, attributes: ["id", "proposalId", "status", "amountCents", "paidAt"], order: [["id", "ASC"]], transaction: t })
    : [];
  const deposit = new Map<number, DepositDto>();
  for (const p of payments) deposit.set(p.proposalId, pick(deposit.get(p.proposalId), p));
  for (const r of rows) {
    out.set(r.jobId, {
      status: r.status,
      sentAt: r.createdAt.toISOString(),
      viewedAt: iso(r.viewedAt),
      acceptedAt: iso(r.acceptedAt),
      declinedAt: iso(r.declinedAt),
      depositStatus: deposit.get(r.id)?.status ?? null,
    });
  }
  return out;
}
