import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";
import { json, stubApi } from "./fetch-stub";
import { crew, estimator, jobDetail, listItem, owner, page, team } from "./jobs-fixtures";

function renderApp(path: string) {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter(createAppRoutes(qc), { initialEntries: [path] });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { router };
}

/** The first render loads the board's chunk; give it longer than findBy's default second. */
const findTable = () => screen.findByRole("table", { name: "Jobs" }, { timeout: 5000 });
const search = (router: ReturnType<typeof createMemoryRouter>) => new URLSearchParams(router.state.location.search);
const jobsQuery = (path: string) => new URLSearchParams(path.split("?")[1] ?? "");

const rows = [
  listItem(12, { customer: { id: 112, name: "Ada Quarry" }, status: "proposed", squares: 28.4, quoteTotalCents: 1_845_000 }),
  listItem(7, { customer: { id: 107, name: "Ben Marsh" }, status: "lost", squares: null, quoteTotalCents: null, estimator: null, estimatorId: null }),
];

beforeEach(() => {
  resetCsrfToken();
});

describe("jobs board", () => {
  it("renders a row per job with status text, customer link, squares, quote total and estimator", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/jobs": () => json(200, page(rows)),
    });
    renderApp("/jobs");

    const table = await findTable();
    const body = within(table).getAllByRole("row").slice(1);
    expect(body).toHaveLength(2);
    const first = within(body[0]!);
    expect(first.getByText("Proposed")).toBeInTheDocument(); // the status in words, not only a colour
    expect(first.getByRole("link", { name: "Ada Quarry" })).toHaveAttribute("href", "/jobs/12/site");
    expect(first.getByText("28.4")).toBeInTheDocument();
    expect(first.getByText("$18,450")).toBeInTheDocument();
    expect(first.getByText(estimator.name)).toBeInTheDocument();
    const second = within(body[1]!);
    expect(second.getByText("Lost")).toBeInTheDocument();
    expect(second.getByText("Unassigned")).toBeInTheDocument();
    expect(screen.getByText("1–2 of 2 jobs")).toBeInTheDocument();

    // the default request: first page, 25 a page, most recently changed first, live jobs
    const q = jobsQuery(api.callsTo("GET /api/jobs")[0]!.path);
    expect(Object.fromEntries(q)).toEqual({ page: "1", pageSize: "25", sort: "-updatedAt" });
    expect(screen.getByRole("columnheader", { name: /Last change/ })).toHaveAttribute("aria-sort", "descending");
    expect(screen.getByRole("button", { name: "New job" })).toBeInTheDocument();
  });

  it("sorting by a header changes the request and the URL; a second click reverses it", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/jobs": () => json(200, page(rows)),
    });
    const { router } = renderApp("/jobs");
    await findTable();
    const user = userEvent.setup();

    const customerHeader = screen.getByRole("columnheader", { name: /Customer/ });
    expect(customerHeader).toHaveAttribute("aria-sort", "none");
    await user.click(within(customerHeader).getByRole("button", { name: /Customer/ }));

    await waitFor(() => expect(jobsQuery(api.callsTo("GET /api/jobs").at(-1)!.path).get("sort")).toBe("customer"));
    expect(search(router).get("sort")).toBe("customer");
    expect(screen.getByRole("columnheader", { name: /Customer/ })).toHaveAttribute("aria-sort", "ascending");

    // keyboard: the header button is focusable and Enter sorts the other way
    within(screen.getByRole("columnheader", { name: /Customer/ })).getByRole("button").focus();
    await user.keyboard("{Enter}");
    await waitFor(() => expect(jobsQuery(api.callsTo("GET /api/jobs").at(-1)!.path).get("sort")).toBe("-customer"));
    expect(screen.getByRole("columnheader", { name: /Customer/ })).toHaveAttribute("aria-sort", "descending");

    // numbers sort high first on the first click
    await user.click(within(screen.getByRole("columnheader", { name: /Squares/ })).getByRole("button"));
    await waitFor(() => expect(jobsQuery(api.callsTo("GET /api/jobs").at(-1)!.path).get("sort")).toBe("-squares"));
  });

  it("search is debounced into one request with q, back on page 1, and kept in the URL", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/jobs": (call) =>
        json(200, jobsQuery(call.path).get("q") ? page([rows[0]!]) : page(rows, { total: 60, page: 2 })),
    });
    const { router } = renderApp("/jobs?page=2");
    await findTable();
    expect(jobsQuery(api.callsTo("GET /api/jobs")[0]!.path).get("page")).toBe("2");
    const before = api.callsTo("GET /api/jobs").length;

    await userEvent.setup().type(screen.getByRole("searchbox", { name: "Search jobs" }), "quarry");

    await waitFor(() => expect(search(router).get("q")).toBe("quarry"));
    await waitFor(() => expect(api.callsTo("GET /api/jobs").length).toBeGreaterThan(before));
    await new Promise((r) => setTimeout(r, 400)); // longer than the debounce: any extra request would be here
    const searches = api.callsTo("GET /api/jobs").slice(before).map((c) => jobsQuery(c.path));
    expect(searches).toHaveLength(1); // not one request per keystroke
    expect(searches[0]!.get("q")).toBe("quarry");
    expect(searches[0]!.get("page")).toBe("1");
    expect(search(router).get("page")).toBeNull();
    await waitFor(() => expect(within(screen.getByRole("table", { name: "Jobs" })).getAllByRole("row")).toHaveLength(2));
  });

  it("Enter searches at once, and the pause timer does not navigate a second time afterwards", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/jobs": (call) => json(200, jobsQuery(call.path).get("q") ? page([rows[0]!]) : page(rows)),
    });
    const { router } = renderApp("/jobs");
    await findTable();
    const box = screen.getByRole("searchbox", { name: "Search jobs" });
    const user = userEvent.setup();
    await user.type(box, "quarry");
    const keysBefore = router.state.location.key;
    const navigations: string[] = [];
    const stop = router.subscribe((state) => {
      if (!navigations.includes(state.location.key) && state.location.key !== keysBefore) navigations.push(state.location.key);
    });
    await user.keyboard("{Enter}");
    await waitFor(() => expect(search(router).get("q")).toBe("quarry"));
    // Enter ran within the 300 ms pause of the last keystroke: a late second report would replace the
    // location again (and, had the person clicked away meanwhile, pull them back to the board)
    await new Promise((r) => setTimeout(r, 450));
    stop();
    expect(navigations).toHaveLength(1);
    expect(search(router).get("q")).toBe("quarry");
  });

  it("the status and estimator filters and the archived view go into the request", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/jobs": () => json(200, page(rows)),
    });
    const { router } = renderApp("/jobs");
    await findTable();
    const user = userEvent.setup();

    await user.selectOptions(screen.getByRole("combobox", { name: "Status" }), "won");
    await waitFor(() => expect(jobsQuery(api.callsTo("GET /api/jobs").at(-1)!.path).get("status")).toBe("won"));

    await user.selectOptions(screen.getByRole("combobox", { name: "Estimator" }), "none");
    await waitFor(() => expect(jobsQuery(api.callsTo("GET /api/jobs").at(-1)!.path).get("estimatorId")).toBe("none"));

    await user.click(screen.getByRole("button", { name: "Archived" }));
    await waitFor(() => expect(jobsQuery(api.callsTo("GET /api/jobs").at(-1)!.path).get("archived")).toBe("1"));
    expect(Object.fromEntries(search(router))).toEqual({ status: "won", estimator: "none", archived: "1" });
  });

  it("clicking a row (not only its link) opens the job's Site section", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/jobs": () => json(200, page(rows)),
      "GET /api/jobs/12": () => json(200, { data: jobDetail(12, { customer: { id: 112, name: "Ada Quarry", email: null, phone: null } }) }),
    });
    const { router } = renderApp("/jobs");
    const table = await findTable();

    await userEvent.setup().click(within(table).getByText("28.4"));

    await waitFor(() => expect(router.state.location.pathname).toBe("/jobs/12/site"));
    expect(await screen.findByRole("heading", { level: 1, name: /Ada Quarry/ })).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Jobs board" })).toHaveAttribute("href", "/jobs");
  });

  it("crew see their jobs without quote totals and without a New job button", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: crew }),
      "GET /api/jobs": () => json(200, page(rows.map(({ quoteTotalCents: _omit, ...r }) => r))),
    });
    renderApp("/jobs");
    const table = await findTable();
    expect(within(table).queryByRole("columnheader", { name: /Quote/ })).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "New job" })).not.toBeInTheDocument();
    expect(screen.queryByRole("combobox", { name: "Estimator" })).not.toBeInTheDocument();
    expect(screen.getByText("The jobs you're assigned to.")).toBeInTheDocument();
  });

  it("shows an empty state with a way out when the filters match nothing", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/jobs": () => json(200, page([])),
    });
    renderApp("/jobs?q=nothing-like-this");
    expect(await screen.findByRole("heading", { name: "No jobs match" }, { timeout: 5000 })).toBeInTheDocument();
    expect(screen.getAllByRole("button", { name: "Clear filters" }).length).toBeGreaterThan(0);
  });

  it("a failing list shows the error and Try again", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/jobs": [
        () => json(400, { error: { code: "bad_request", message: "Use one of the sorts" } }),
        () => json(200, page(rows)),
      ],
    });
    renderApp("/jobs");
    expect(await screen.findByText("The jobs could not be loaded", undefined, { timeout: 5000 })).toBeInTheDocument();
    await userEvent.setup().click(screen.getByRole("button", { name: "Try again" }));
    expect(await findTable()).toBeInTheDocument();
  });

  it("an estimator's estimator filter offers Mine (they can't read the team list)", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/jobs": () => json(200, page(rows)),
    });
    renderApp("/jobs");
    await findTable();
    await userEvent.setup().selectOptions(screen.getByRole("combobox", { name: "Estimator" }), "Mine");
    await waitFor(() =>
      expect(jobsQuery(api.callsTo("GET /api/jobs").at(-1)!.path).get("estimatorId")).toBe(String(estimator.id)),
    );
    expect(api.callsTo("GET /api/users")).toHaveLength(0);
  });
});
