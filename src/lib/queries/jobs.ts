/** Jobs: one key factory and the queries the board, the workspace, customers, roof and proposals share. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import type { AuditEventDto } from "@shared/schemas/audit";
import type { ListMeta } from "@shared/schemas/customer";
import type { JobDto, JobListItem, JobSort } from "@shared/schemas/job";
import { api, toSearch } from "@/lib/api-client";

/** The board's request: exactly the query parameters sent to GET /api/jobs (absent = server default). */
export type JobListRequest = {
  page?: number;
  pageSize?: number;
  sort?: JobSort;
  q?: string;
  /** One status or several, comma-separated. */
  status?: string;
  /** A user id or "none" (unassigned). */
  estimatorId?: string;
  archived?: "1";
};

export type AuditPage = { page: number; pageSize: number };

export const jobKeys = {
  all: ["jobs"] as const,
  lists: () => [...jobKeys.all, "list"] as const,
  list: (q: JobListRequest) => [...jobKeys.lists(), q] as const,
  details: () => [...jobKeys.all, "detail"] as const,
  detail: (id: number) => [...jobKeys.details(), id] as const,
  audits: (id: number) => [...jobKeys.all, "audit", id] as const,
  audit: (id: number, p: AuditPage) => [...jobKeys.audits(id), p] as const,
};

export type JobList = { data: JobListItem[]; meta: ListMeta };

export const jobQueries = {
  list: (q: JobListRequest) =>
    queryOptions({
      queryKey: jobKeys.list(q),
      queryFn: ({ signal }) =>
        api<JobList>(
          `/jobs${toSearch({
            page: q.page,
            pageSize: q.pageSize,
            sort: q.sort,
            q: q.q,
            status: q.status,
            estimatorId: q.estimatorId,
            archived: q.archived,
          })}`,
          { signal },
        ),
      placeholderData: keepPreviousData, // the old page stays on screen while the next one loads
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: jobKeys.detail(id),
      queryFn: ({ signal }) => api<{ data: JobDto }>(`/jobs/${id}`, { signal }).then((r) => r.data),
    }),
  audit: (id: number, p: AuditPage) =>
    queryOptions({
      queryKey: jobKeys.audit(id, p),
      queryFn: ({ signal }) =>
        api<{ data: AuditEventDto[]; meta: ListMeta }>(`/jobs/${id}/audit${toSearch(p)}`, { signal }),
      placeholderData: keepPreviousData,
    }),
};

export const useJobs = (q: JobListRequest) => useQuery(jobQueries.list(q));
export const useJob = (id: number, enabled = true) => useQuery({ ...jobQueries.detail(id), enabled });
export const useJobAudit = (id: number, p: AuditPage) => useQuery(jobQueries.audit(id, p));
