import type { AuditEventDto } from "../../shared/schemas/audit";
import type { AuditEvent, User } from "../models/index";
import { parseJsonColumn } from "./job.presenter";

export function presentAuditEvent(e: AuditEvent & { actor?: User | null }): AuditEventDto {
  return {
    id: Number(e.id),
    entityType: e.entityType,
    entityId: e.entityId,
    jobId: e.jobId ?? null,
    action: e.action,
    changes: e.changes === null ? null : parseJsonColumn<Record<string, unknown>>(e.changes),
    actor: e.actor ? { id: e.actor.id, name: e.actor.name } : null,
    createdAt: e.createdAt.toISOString(),
  };
}
