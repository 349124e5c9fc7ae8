import type { Transaction } from "sequelize";
import { AuditEvent } from "../models/index";

export interface AuditEntry {
  companyId: number;
  actorId: number | null;
  entityType: string;
  entityId: string | number;
  /** The job this event concerns (shown in that job's log): set it for job, roof and quote events. */
  jobId?: number | null;
  action: string;
  changes?: Record<string, unknown> | null;
}

/** Records who changed what; callers pass their transaction so the entry commits with the change. */
export async function recordAudit(entry: AuditEntry, transaction?: Transaction): Promise<void> {
  await AuditEvent.create(
    {
      companyId: entry.companyId,
      actorId: entry.actorId,
      entityType: entry.entityType,
      entityId: String(entry.entityId),
      jobId: entry.jobId ?? null,
      action: entry.action,
      changes: entry.changes ?? null,
    },
    { transaction },
  );
}
