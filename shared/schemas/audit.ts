/** The audit log: GET /api/jobs/:id/audit (a job's events) and GET /api/audit (the company's, owner only). */
import { z } from "zod";
import { pagingShape } from "./customer";

export const auditListQuerySchema = z.object({
  ...pagingShape,
  /** Only events about one kind of record: job, roof, customer, user, quote, price-book… */
  entityType: z.string().trim().min(1).max(40, "Use at most 40 characters").optional(),
  actorId: z.coerce.number({ error: "Pick a user" }).int("Pick a user").positive("Pick a user").max(4294967295).optional(),
});
export type AuditListQuery = z.output<typeof auditListQuerySchema>;

export const auditEventDtoSchema = z.object({
  id: z.number().int(),
  entityType: z.string(),
  entityId: z.string(),
  jobId: z.number().int().nullable(),
  action: z.string(),
  changes: z.record(z.string(), z.unknown()).nullable(),
  /** Who did it; null for the system (or a user since removed). */
  actor: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  createdAt: z.string(),
});
export type AuditEventDto = z.infer<typeof auditEventDtoSchema>;
