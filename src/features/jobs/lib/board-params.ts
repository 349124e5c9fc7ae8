import { JOB_SORTS, type JobSort, type JobStatus } from "@shared/schemas/job";
import type { JobListRequest } from "@/lib/queries/jobs";
import { isJobStatus, OPEN_STATUSES } from "@/features/jobs/lib/status";

/**
 * The board's state lives in the URL (`/jobs?q=quarry&status=open&sort=customer&page=2`), so reload,
 * back and a shared link all show the same board. Unknown or malformed values fall back to the defaults.
 */
export const PAGE_SIZES = [25, 50, 100] as const;
export const DEFAULT_SORT: JobSort = "-updatedAt";

/** Sortable columns and the direction a first click sorts them in (names A→Z, numbers and dates high first). */
export const SORTABLE = {
  status: "asc",
  customer: "asc",
  squares: "desc",
  quoteTotal: "desc",
  updatedAt: "desc",
} as const;
export type SortColumn = keyof typeof SORTABLE;

export type BoardState = {
  q: string;
  /** "" (all), "open" (still in play) or one status. */
  status: "" | "open" | JobStatus;
  /** "" (anyone), "none" (unassigned) or a user id. */
  estimator: string;
  sort: JobSort;
  page: number;
  pageSize: number;
  archived: boolean;
};

export function readBoard(sp: URLSearchParams): BoardState {
  const status = sp.get("status") ?? "";
  const estimator = sp.get("estimator") ?? "";
  const sort = sp.get("sort") ?? "";
  const page = Number(sp.get("page"));
  const size = Number(sp.get("size"));
  return {
    q: (sp.get("q") ?? "").slice(0, 120),
    status: status === "open" || isJobStatus(status) ? status : "",
    estimator: estimator === "none" || /^[1-9]\d{0,9}$/.test(estimator) ? estimator : "",
    sort: (JOB_SORTS as readonly string[]).includes(sort) ? (sort as JobSort) : DEFAULT_SORT,
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    pageSize: (PAGE_SIZES as readonly number[]).includes(size) ? size : PAGE_SIZES[0],
    archived: sp.get("archived") === "1",
  };
}

/** The URL for a board state: defaults are left out, so a plain `/jobs` is the default board. */
export function writeBoard(s: BoardState): URLSearchParams {
  const sp = new URLSearchParams();
  if (s.q.trim()) sp.set("q", s.q.trim());
  if (s.status) sp.set("status", s.status);
  if (s.estimator) sp.set("estimator", s.estimator);
  if (s.sort !== DEFAULT_SORT) sp.set("sort", s.sort);
  if (s.page > 1) sp.set("page", String(s.page));
  if (s.pageSize !== PAGE_SIZES[0]) sp.set("size", String(s.pageSize));
  if (s.archived) sp.set("archived", "1");
  return sp;
}

/** The GET /api/jobs parameters for a board state. */
export function toRequest(s: BoardState): JobListRequest {
  return {
    page: s.page,
    pageSize: s.pageSize,
    sort: s.sort,
    q: s.q.trim() || undefined,
    status: s.status === "open" ? OPEN_STATUSES.join(",") : s.status || undefined,
    estimatorId: s.estimator === "" ? undefined : s.estimator === "none" ? "none" : s.estimator,
    archived: s.archived ? "1" : undefined,
  };
}

/** The column a sort is on and its direction. */
export function sortOf(sort: JobSort): { column: string; dir: "asc" | "desc" } {
  return sort.startsWith("-") ? { column: sort.slice(1), dir: "desc" } : { column: sort, dir: "asc" };
}

/** Clicking a header: the same column flips; another column starts in its natural direction. */
export function nextSort(current: JobSort, column: SortColumn): JobSort {
  const { column: c, dir } = sortOf(current);
  const d = c === column ? (dir === "asc" ? "desc" : "asc") : SORTABLE[column];
  return (d === "desc" ? `-${column}` : column) as JobSort;
}
