/** The customers screen keeps its search, page and archived view in the URL (`/customers?q=ann&page=2`). */
export const CUSTOMER_PAGE_SIZES = [25, 50, 100] as const;

export type CustomerListState = { q: string; page: number; pageSize: number; archived: boolean };

export function readCustomerList(sp: URLSearchParams): CustomerListState {
  const page = Number(sp.get("page"));
  const size = Number(sp.get("size"));
  return {
    q: (sp.get("q") ?? "").slice(0, 120),
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    pageSize: (CUSTOMER_PAGE_SIZES as readonly number[]).includes(size) ? size : CUSTOMER_PAGE_SIZES[0],
    archived: sp.get("archived") === "1",
  };
}

export function writeCustomerList(s: CustomerListState): URLSearchParams {
  const sp = new URLSearchParams();
  if (s.q.trim()) sp.set("q", s.q.trim());
  if (s.page > 1) sp.set("page", String(s.page));
  if (s.pageSize !== CUSTOMER_PAGE_SIZES[0]) sp.set("size", String(s.pageSize));
  if (s.archived) sp.set("archived", "1");
  return sp;
}
