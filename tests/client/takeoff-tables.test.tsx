import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { MemoryRouter } from "react-router-dom";
import { computeTakeoff } from "@shared/engine/takeoff";
import type { TakeoffResult } from "@shared/engine/types";
import { resetCsrfToken } from "@/lib/api-client";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { JobTakeoffSection } from "@/app/routes/jobs/job-takeoff";
import { csvField, cutListCsv, takeoffCsv } from "@/features/takeoff/csv";
import { json, stubApi } from "./fetch-stub";
import { demoRoof, job, JOB_ID } from "./stack-fixtures";

let takeoff: TakeoffResult;
beforeAll(() => {
  const roof = demoRoof();
  const out = computeTakeoff({ site: job.site, planes: roof.planes, stacks: roof.stacks, defaultStackId: roof.defaultStackId });
  if (!out.ok) throw new Error(out.reason);
  takeoff = out.result;
});

function renderSection() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <MemoryRouter>
        <JobTakeoffSection jobId={JOB_ID} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const routes = (t: TakeoffResult | null) => ({
  [`GET /api/jobs/${JOB_ID}/takeoff`]: () => json(200, { data: t }),
  [`GET /api/jobs/${JOB_ID}/roof`]: () => json(200, { data: demoRoof() }),
});

beforeEach(() => {
  resetCsrfToken();
  roofDraftStore.clearAll();
  localStorage.clear();
});

describe("Takeoff section", { timeout: 20_000 }, () => {
  it("groups the stored materials by category and expands a row's basis", async () => {
    stubApi(routes(takeoff));
    renderSection();
    const user = userEvent.setup();
    const table = await screen.findByRole("table", { name: "Materials" });

    // one group per category present, each holding exactly that category's lines
    const categories = [...new Set(takeoff.materials.map((m) => m.category))];
    const groups = within(table).getAllByRole("rowgroup").filter((g) => g.getAttribute("aria-label"));
    expect(groups).toHaveLength(categories.length);
    const spacer = within(table).getByRole("rowgroup", { name: "Spacer" });
    const spacerKeys = takeoff.materials.filter((m) => m.category === "spacer").map((m) => m.key);
    expect(spacerKeys.length).toBeGreaterThan(0);
    for (const key of spacerKeys) expect(within(spacer).getByText(key)).toBeInTheDocument();
    expect(within(spacer).queryByText("clip")).toBeNull();

    const panel = takeoff.materials.find((m) => m.key === "panel-standing-seam")!;
    const basisButton = within(table).getByRole("button", { name: `Basis for ${panel.description}` });
    expect(basisButton).toHaveAttribute("aria-expanded", "false");
    expect(screen.getByText(panel.basis)).not.toBeVisible();
    await user.click(basisButton);
    expect(basisButton).toHaveAttribute("aria-expanded", "true");
    expect(basisButton).toHaveAccessibleName(`Hide basis for ${panel.description}`);
    expect(screen.getByText(panel.basis)).toBeVisible();
  });

  it("lists the cut list per plane, the zone diagrams and the advisories with severity words", async () => {
    stubApi(routes(takeoff));
    renderSection();
    const south = await screen.findByRole("region", { name: "Cut list, South slope" });
    const p = takeoff.planes.find((x) => x.name === "South slope")!;
    for (const c of p.panels.cutList) {
      const row = within(south).getByText(String(c.lengthIn)).closest("tr")!;
      expect(row).toHaveTextContent(`× ${c.count}`);
    }
    expect(screen.getByTestId(`zone-diagram-${p.id}`)).toBeInTheDocument();
    const list = screen.getByRole("list", { name: "Advisories" });
    expect(within(list).getAllByRole("listitem")).toHaveLength(takeoff.advisories.length);
    if (takeoff.advisories.some((a) => a.severity === "warning")) expect(within(list).getAllByText("Warning").length).toBeGreaterThan(0);
  });

  it("shows an empty state linking to Roof sketch before the first save", async () => {
    stubApi(routes(null));
    renderSection();
    expect(await screen.findByText("No saved roof yet")).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Open Roof sketch" })).toHaveAttribute("href", `/jobs/${JOB_ID}/roof-sketch`);
  });

  it("says it shows the last saved roof when the draft has unsaved changes", async () => {
    stubApi(routes(takeoff));
    roofDraftStore.load({ ...demoRoof(), jobId: JOB_ID });
    roofDraftStore.update(JOB_ID, (d) => ({ ...d, defaultStackId: "mesh" }));
    renderSection();
    expect(await screen.findByText("Showing the last saved roof")).toBeInTheDocument();
  });

  it("exports the takeoff and the cut list as CSV with proper quoting", async () => {
    // RFC 4180: fields with commas, quotes or line breaks are quoted, quotes doubled
    expect(csvField('12" panels, ribbed')).toBe('"12"" panels, ribbed"');
    expect(csvField("plain")).toBe("plain");
    expect(csvField("=SUM(A1)")).toBe("'=SUM(A1)");
    expect(csvField(3.5)).toBe("3.5");

    const csv = takeoffCsv(takeoff);
    const lines = csv.trimEnd().split("\r\n");
    expect(lines[0]).toBe("category,key,description,quantity,unit,basis");
    expect(lines).toHaveLength(takeoff.materials.length + 1);
    const panel = takeoff.materials.find((m) => m.key === "panel-standing-seam")!;
    expect(lines.find((l) => l.startsWith("panels,panel-standing-seam,"))).toBe(
      ["panels", "panel-standing-seam", csvField(panel.description), String(panel.quantity), panel.unit, csvField(panel.basis)].join(","),
    );

    const cut = cutListCsv(takeoff).trimEnd().split("\r\n");
    expect(cut[0]).toBe("plane_id,plane_name,system,coverage_in,length_in,length_ft_in,count");
    const p = takeoff.planes[0]!;
    const c = p.panels.cutList[0]!;
    const ftIn = `${Math.floor(c.lengthIn / 12)}' ${c.lengthIn % 12}"`;
    expect(cut[1]).toBe(`${p.id},${p.name},${p.panels.system},${p.panels.coverageWidthIn},${c.lengthIn},"${ftIn.replace(/"/g, '""')}",${c.count}`);
    expect(cut).toHaveLength(1 + takeoff.planes.reduce((n, x) => n + x.panels.cutList.length, 0));

    // the buttons download a file built from the stored takeoff
    stubApi(routes(takeoff));
    const created: Blob[] = [];
    const createObjectURL = vi.fn((b: Blob) => {
      created.push(b);
      return "blob:x";
    });
    vi.stubGlobal("URL", Object.assign(URL, { createObjectURL, revokeObjectURL: vi.fn() }));
    const click = vi.spyOn(HTMLAnchorElement.prototype, "click").mockImplementation(() => {});
    renderSection();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Export cut list CSV" }));
    expect(click).toHaveBeenCalledTimes(1);
    const bytes = new Uint8Array(await created[0]!.arrayBuffer());
    expect([...bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]); // UTF-8 byte-order mark for spreadsheet programs
    expect(new TextDecoder("utf-8", { ignoreBOM: true }).decode(bytes.slice(3))).toBe(cutListCsv(takeoff));
  });
});
