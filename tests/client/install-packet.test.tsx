import { beforeEach, describe, expect, it, vi } from "vitest";
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { computeTakeoff } from "@shared/engine/takeoff";
import { gableRoof, shedRoof } from "@shared/engine/roof/generators";
import type { TakeoffResult } from "@shared/engine/types";
import { installPacketDocSchema, type InstallPacketDocDto } from "@shared/schemas/install-packet";
import { formatInchesAsFeet } from "@shared/schemas/proposal";
import { buildInstallPacketDoc } from "@server/services/install-packet-content";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";
import { json, stubApi } from "./fetch-stub";
import { crew, jobDetail, owner } from "./jobs-fixtures";

/** A packet as the server builds it: a 40 × 30 ft gable with battens and foil, and a porch shed on mesh. */
function packetDoc(): InstallPacketDocDto {
  const planes = [...gableRoof(40, 30, 8, { idPrefix: "house" }), ...shedRoof(12, 8, 3, { idPrefix: "porch", origin: [60, 0], stackId: "porch" })];
  const stacks = [
    {
      id: "main",
      name: "Battens and foil",
      radiantBarrier: { kind: "foil", position: "on-deck" },
      spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: true } },
    },
    { id: "porch", name: "Porch on mesh", spacer: { kind: "mesh", thicknessIn: 0.375 } },
  ];
  const site = { climateZone: "5A", iceDamRisk: true };
  const out = computeTakeoff({ site, planes, stacks, defaultStackId: "main" } as Parameters<typeof computeTakeoff>[0]);
  if (!out.ok) throw new Error(out.reason);
  const doc = buildInstallPacketDoc({
    company: { name: "Fenwick Hollow Metalworks", phone: "555-0142" },
    job: { id: 12, customerName: "Customer 12", siteAddressLine1: "12 Quarry Lane", siteCity: "Millbrook", site, crew: [{ name: crew.name }] },
    roof: { planes, stacks, defaultStackId: "main" },
    takeoff: out.result as TakeoffResult,
    date: "2026-04-02",
    photos: [{ caption: "Service drop at the east gable: keep ladders clear", attachmentId: 5 }],
  });
  return installPacketDocSchema.parse(doc);
}

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

describe("install packet page", () => {
  it("renders each plane's cut list, the layer notes, the zone diagrams, the photos and the cautions from the server's packet", async () => {
    const doc = packetDoc();
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: crew }),
      "GET /api/jobs/12/install-packet": () => json(200, { data: doc }),
    });
    renderApp("/jobs/12/packet");
    expect(await screen.findByRole("heading", { level: 1, name: "Install packet" }, slow)).toBeInTheDocument();
    expect(api.callsTo("GET /api/jobs/12/install-packet")).toHaveLength(1);
    expect(screen.getByText("12 Quarry Lane, Millbrook")).toBeInTheDocument();
    const facts = screen.getByRole("heading", { level: 1, name: "Install packet" }).closest("header")!;
    expect(within(facts).getByText(crew.name)).toBeInTheDocument();

    // Cut list per plane: every length and count, in the plane's own table.
    expect(doc.planes.length).toBe(3);
    for (const p of doc.planes) {
      const table = screen.getByRole("table", { name: `Cut list, plane ${p.number}` });
      expect(p.cutList.length).toBeGreaterThan(0);
      for (const c of p.cutList) {
        const row = within(table).getByText(`${formatInchesAsFeet(c.lengthIn)} (${c.lengthIn} in)`).closest("tr")!;
        expect(within(row).getByText(String(c.count))).toBeInTheDocument();
      }
      expect(screen.getByRole("table", { name: `Fasteners by zone, plane ${p.number}` })).toBeInTheDocument();
      expect(screen.getByRole("img", { name: new RegExp(`Wind zones of plane ${p.number}, `) })).toBeInTheDocument();
    }
    // The layer stack in install order, per area, with the notes that matter.
    const main = screen.getByRole("region", { name: "Layer stack in install order: Battens and foil" });
    const steps = within(main).getAllByText(/^\d+\. /, { selector: "p" }).map((el) => el.textContent);
    expect(steps.slice(0, 3)).toEqual(["1. Deck", "2. Ice barrier at the eaves", "3. Underlayment"]);
    expect(steps.indexOf("4. Radiant barrier (foil)")).toBeGreaterThan(-1);
    expect(within(main).getByText("FOIL FACE UP, toward the air gap.")).toBeInTheDocument();
    expect(within(main).getByText(/^BATTEN SPACING 24 IN ON CENTRE/)).toBeInTheDocument();
    expect(within(main).getAllByText(/^VENT OPENINGS: leave the gap open at the eave/).length).toBeGreaterThan(0);
    expect(screen.getByRole("region", { name: "Layer stack in install order: Porch on mesh" })).toBeInTheDocument();

    // Safety cautions and the reminder that the panel maker's details and local codes govern.
    const safety = screen.getByRole("region", { name: "Safety first" });
    expect(doc.cautions.items.map((c) => c.title)).toEqual(expect.arrayContaining(["Falls", "Power lines"]));
    for (const c of doc.cautions.items) {
      expect(within(safety).getByText(`${c.title}.`)).toBeInTheDocument();
      expect(within(safety).getByText(c.text)).toBeInTheDocument();
    }
    expect(within(safety).getByText(doc.cautions.governs)).toBeInTheDocument();
    expect(doc.cautions.governs).toMatch(/panel maker's tested installation details/);

    // Trim pieces and the crew's photo, shown from its thumbnail.
    const trim = screen.getByRole("table", { name: "Trim pieces" });
    for (const m of doc.trim) expect(within(trim).getByText(m.description)).toBeInTheDocument();
    expect(screen.getByRole("img", { name: "Service drop at the east gable: keep ladders clear" })).toHaveAttribute("src", "/api/attachments/5/thumb");

    expect(screen.getByRole("link", { name: "Download PDF" })).toHaveAttribute("href", "/api/jobs/12/install-packet.pdf");
    const print = vi.spyOn(window, "print").mockImplementation(() => undefined);
    await userEvent.click(screen.getByRole("button", { name: "Print" }));
    expect(print).toHaveBeenCalledTimes(1);
    print.mockRestore();
  });

  it("explains a job without a saved roof and offers the office the roof sketch", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/jobs/12/install-packet": () =>
        json(409, { error: { code: "no_roof", message: "This job has no saved roof yet: the install packet is built from the saved roof and its takeoff." } }),
    });
    renderApp("/jobs/12/packet");
    expect(await screen.findByText(/This job has no saved roof yet/, undefined, slow)).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Open the roof sketch" })).toHaveAttribute("href", "/jobs/12/roof-sketch");
    expect(screen.queryByRole("link", { name: "Download PDF" })).not.toBeInTheDocument();
  });

  it("shows not found for a job the server does not show this user", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: crew }),
      "GET /api/jobs/99/install-packet": () => json(404, { error: { code: "not_found", message: "Job not found" } }),
    });
    renderApp("/jobs/99/packet");
    expect(await screen.findByRole("heading", { name: "Page not found" }, slow)).toBeInTheDocument();
  });

  it("the job header links the crew to the packet and to the photo upload first", async () => {
    const { quoteTotalCents: _omit, ...forCrew } = jobDetail(12, { crew: [{ id: crew.id, name: crew.name }] });
    stubApi({
      "GET /api/auth/me": () => json(200, { user: crew }),
      "GET /api/jobs/12": () => json(200, { data: forCrew }),
    });
    renderApp("/jobs/12/site");
    const title = await screen.findByRole("heading", { level: 1, name: /Customer 12/ }, slow);
    const header = title.closest("header")!;
    expect(within(header).getByRole("link", { name: "Install packet" })).toHaveAttribute("href", "/jobs/12/packet");
    expect(within(header).getByRole("link", { name: "Photos & files" })).toHaveAttribute("href", "/jobs/12/files");
  });
});
