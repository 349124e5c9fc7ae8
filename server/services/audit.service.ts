import { QueryTypes, type Transaction } from "sequelize";
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

/**
 * Records who changed what; callers pass their transaction so the entry commits with the change. Every
 * write in the app makes one, so it is a single plain INSERT rather than a model object.
 */
export async function recordAudit(entry: AuditEntry, transaction?: Transaction): Promise<void> {
  await AuditEvent.sequelize!.query(
    `INSERT INTO audit_events (company_id, actor_id, entity_type, entity_id, job_id, action, changes, created_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
    {
      replacements: [
        entry.companyId,
        entry.actorId,
        entry.entityType,
        String(entry.entityId),
        entry.jobId ?? null,
        entry.action,
        entry.changes === undefined || entry.changes === null ? null : JSON.stringify(entry.changes),
        new Date(),
      ],
      type: QueryTypes.INSERT,
      transaction,
    },
  );
}
