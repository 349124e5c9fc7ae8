import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import type { AuditEventDto } from "@shared/schemas/audit";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";
import { summarizeAudit } from "@/features/jobs/lib/audit-summary";
import { json, stubApi } from "./fetch-stub";
import { crew, estimator, jobDetail, owner, page, team } from "./jobs-fixtures";

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

const slow = { timeout: 5000 };

beforeEach(() => {
  resetCsrfToken();
});

describe("job workspace header", () => {
  it("shows customer and site, status, squares, quote total and estimator, with a link back to the board", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/jobs/12": () => json(200, { data: jobDetail(12, { status: "proposed" }) }),
    });
    renderApp("/jobs/12/site");
    const title = await screen.findByRole("heading", { level: 1, name: /Customer 12/ }, slow);
    expect(title).toHaveTextContent("12 Quarry Lane, Millbrook, Eastshire 00012");
    const header = title.closest("header")!;
    expect(within(header).getByText("Proposed")).toBeInTheDocument();
    expect(within(header).getByText("24.6")).toBeInTheDocument();
    expect(within(header).getByText("$18,450")).toBeInTheDocument();
    expect(within(header).getByText(estimator.name)).toBeInTheDocument();
    expect(within(header).getByRole("link", { name: "Jobs board" })).toHaveAttribute("href", "/jobs");
  });

  it("crew get no quote total", async () => {
    const { quoteTotalCents: _omit, ...forCrew } = jobDetail(12, { crew: [{ id: crew.id, name: crew.name }] });
    stubApi({
      "GET /api/auth/me": () => json(200, { user: crew }),
      "GET /api/jobs/12": () => json(200, { data: forCrew }),
    });
    renderApp("/jobs/12/site");
    await screen.findByRole("heading", { level: 1, name: /Customer 12/ }, slow);
    expect(screen.queryByText("Quote total")).not.toBeInTheDocument();
    // the crew's Site section reads, it doesn't edit
    expect(await screen.findByText("Site data")).toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Save site" })).not.toBeInTheDocument();
    expect(screen.getByText("5A")).toBeInTheDocument();
  });

  it("a job the API answers 404 for shows the not-found screen", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/jobs/404": () => json(404, { error: { code: "not_found", message: "Job not found" } }),
      "GET /api/users": () => json(200, { data: team }),
    });
    renderApp("/jobs/404/site");
    expect(await screen.findByRole("heading", { name: "Page not found" }, slow)).toBeInTheDocument();
  });
});

describe("Site section", () => {
  it("sends only what changed, and the saved job replaces the form's values", async () => {
    const job = jobDetail(12);
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/jobs/12": () => json(200, { data: job }),
      "PATCH /api/jobs/12": (call) =>
        json(200, { data: { ...job, site: { ...job.site, ...(call.body as { site: object }).site }, updatedAt: "2026-12-01T10:00:00.000Z" } }),
      "GET /api/jobs": () => json(200, page([])),
      "GET /api/jobs/12/audit": () => json(200, page([])),
    });
    renderApp("/jobs/12/site");
    const zone = await screen.findByLabelText("Climate zone", undefined, slow);
    expect(zone).toHaveValue("5A");
    const user = userEvent.setup();
    await user.clear(zone);
    await user.type(zone, "6a");
    await user.type(screen.getByLabelText("Basic wind speed (mph)"), "115");
    await user.click(screen.getByRole("button", { name: "Save site" }));

    await waitFor(() => expect(api.callsTo("PATCH /api/jobs/12")).toHaveLength(1));
    const body = api.callsTo("PATCH /api/jobs/12")[0]!.body as { site: Record<string, unknown> };
    expect(Object.keys(body)).toEqual(["site"]); // the address and notes were not touched
    expect(body.site.climateZone).toBe("6A");
    expect(body.site.wind).toMatchObject({ basicWindSpeedMph: 115 });
    await waitFor(() => expect(screen.getByRole("button", { name: "Save site" })).toBeDisabled());
  });

  it("offers only the status moves the API allows and shows a 409 refusal", async () => {
    const job = jobDetail(12, { status: "won" });
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/jobs/12": () => json(200, { data: job }),
      "PATCH /api/jobs/12": () =>
        json(409, { error: { code: "invalid_transition", message: "A job cannot be moved from won to scheduled by hand" } }),
    });
    renderApp("/jobs/12/site");
    const panel = (await screen.findByRole("heading", { name: "Status" }, slow)).closest("section")!;
    const buttons = within(panel)
      .getAllByRole("button")
      .map((b) => b.textContent);
    expect(buttons).toEqual(["Mark scheduled", "Mark lost"]); // MANUAL_STATUS_MOVES.won

    await userEvent.setup().click(within(panel).getByRole("button", { name: "Mark scheduled" }));
    expect(await within(panel).findByRole("alert")).toHaveTextContent("cannot be moved from won to scheduled");
    expect(api.callsTo("PATCH /api/jobs/12")[0]!.body).toEqual({ status: "scheduled" });
  });

  it("an estimator sees the assignment read-only and never asks for the team list", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/jobs/12": () => json(200, { data: jobDetail(12, { crew: [{ id: crew.id, name: crew.name }] }) }),
    });
    renderApp("/jobs/12/site");
    expect(await screen.findByText("Only an owner can change who's assigned to a job.", undefined, slow)).toBeInTheDocument();
    expect(screen.getByText(crew.name)).toBeInTheDocument();
    expect(api.callsTo("GET /api/users")).toHaveLength(0);
  });

  it("an owner assigns crew with PUT /assignment", async () => {
    const job = jobDetail(12);
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/jobs/12": () => json(200, { data: job }),
      "PUT /api/jobs/12/assignment": () =>
        json(200, { data: { ...job, crew: [{ id: crew.id, name: crew.name }], updatedAt: "2026-12-01T10:00:00.000Z" } }),
      "GET /api/jobs": () => json(200, page([])),
      "GET /api/jobs/12/audit": () => json(200, page([])),
    });
    renderApp("/jobs/12/site");
    const user = userEvent.setup();
    await user.click(await screen.findByRole("checkbox", { name: crew.name }, slow));
    await user.click(screen.getByRole("button", { name: "Save assignment" }));
    await waitFor(() => expect(api.callsTo("PUT /api/jobs/12/assignment")).toHaveLength(1));
    expect(api.callsTo("PUT /api/jobs/12/assignment")[0]!.body).toEqual({ estimatorId: estimator.id, crewIds: [crew.id] });
  });
});

describe("Log section", () => {
  const event = (extra: Partial<AuditEventDto>): AuditEventDto => ({
    id: 1,
    entityType: "job",
    entityId: "12",
    jobId: 12,
    action: "updated",
    changes: null,
    actor: { id: estimator.id, name: estimator.name },
    createdAt: "2026-11-20T10:00:00.000Z",
    ...extra,
  });

  it("summarises roof saves, status moves, site changes and assignments in words", () => {
    expect(
      summarizeAudit(event({ entityType: "roof", action: "saved", changes: { version: { from: 3, to: 4 }, planes: 6, stacks: 1, squares: 28.4 } })).title,
    ).toBe("Roof saved: version 3 → 4, 6 planes, 28.4 squares");
    expect(summarizeAudit(event({ action: "updated", changes: { status: { from: "won", to: "scheduled" } } })).title).toBe(
      "Status: Won → Scheduled",
    );
    const site = summarizeAudit(
      event({
        changes: {
          site: { from: { climateZone: "4A", wind: { exposure: "B" } }, to: { climateZone: "5A", wind: { exposure: "C" } } },
        },
      }),
    );
    expect(site.title).toBe("Site data changed");
    expect(site.details).toEqual(["Climate zone: “4A” → “5A”", "Exposure: “B” → “C”"]);
    const names = new Map([[3, "Kit Sample"]]);
    const assigned = summarizeAudit(event({ action: "assigned", changes: { crewIds: { from: [], to: [3] } } }), (id) => names.get(id));
    expect(assigned).toEqual({ title: "Assignment changed", details: ["Crew: none → Kit Sample"] });
    expect(summarizeAudit(event({ entityType: "quote", action: "submitted", changes: { number: "Q-1001", revisionNo: 2 } })).title).toBe(
      "Quote Q-1001 submitted for approval",
    );
  });

  it("lists the job's events newest first with who and when, and pages through the API", async () => {
    const events = [
      event({ id: 2, entityType: "roof", action: "saved", changes: { version: { from: 1, to: 2 }, planes: 4, squares: 21 } }),
      event({ id: 1, action: "created", changes: { customerName: "Customer 12", status: "lead" } }),
    ];
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/jobs/12": () => json(200, { data: jobDetail(12) }),
      "GET /api/jobs/12/audit": (call) =>
        json(200, call.path.includes("page=2") ? page([events[1]!], { page: 2, total: 26 }) : page([events[0]!], { total: 26 })),
    });
    renderApp("/jobs/12/log");
    const table = await screen.findByRole("table", { name: "Change log" }, slow);
    expect(within(table).getByText("Roof saved: version 1 → 2, 4 planes, 21.0 squares")).toBeInTheDocument();
    expect(within(table).getByText(estimator.name)).toBeInTheDocument();
    expect(screen.getByText("1–25 of 26 entries")).toBeInTheDocument();
    await userEvent.setup().click(screen.getByRole("button", { name: "Next page" }));
    expect(await screen.findByText("Job created for Customer 12")).toBeInTheDocument();
    expect(api.callsTo("GET /api/jobs/12/audit").at(-1)!.path).toContain("page=2");
  });
});
