import { QueryTypes, type Transaction } from "sequelize";
import { executeBinary, sqlDateTime } from "../db/sql";
import { AuditEvent } from "../models/index";

const INSERT_AUDIT = "INSERT INTO audit_events (company_id, actor_id, entity_type, entity_id, job_id, action, changes, created_at)";

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
  const sequelize = AuditEvent.sequelize!;
  const values = [
    entry.companyId,
    entry.actorId,
    entry.entityType,
    String(entry.entityId),
    entry.jobId ?? null,
    entry.action,
    entry.changes === undefined || entry.changes === null ? null : JSON.stringify(entry.changes),
  ];
  if (transaction) {
    // On the transaction's connection with the binary protocol (the same row; created_at as Sequelize writes a date).
    await executeBinary(sequelize, transaction, `${INSERT_AUDIT} VALUES (?, ?, ?, ?, ?, ?, ?, ?)`, [...values, sqlDateTime(new Date())]);
    return;
  }
  await sequelize.query(`${INSERT_AUDIT} VALUES (?, ?, ?, ?, ?, ?, ?, ?)`, {
    replacements: [...values, new Date()],
    type: QueryTypes.INSERT,
  });
}
