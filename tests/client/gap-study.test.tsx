import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { MemoryRouter } from "react-router-dom";
import { computeGapStudy } from "@shared/engine/gap-study";
import { resetCsrfToken } from "@/lib/api-client";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { GapStudySection } from "@/features/roof/components/gap-study-section";
import { json, stubApi } from "./fetch-stub";
import { baseRoutes, demoRoof, job, JOB_ID } from "./stack-fixtures";

const mappingFor = (keys: Record<string, number>) =>
  Object.entries(keys).map(([key, cents], i) => ({ key, category: "spacer", unit: "pc", description: key, item: { id: i + 1, sku: key, name: key, purchaseUnit: "pc", unitCostCents: cents } }));
const PRICES = { "batten-1x4": 450, "counter-batten-1x4": 450, "spacer-mesh": 9000, "spacer-dimpled": 12000, "screw-batten": 3000 };
const items = Object.keys(PRICES).map((key, i) => ({ id: i + 1, sku: key, materialKey: key, packCoverage: 1 }));

const routes = () => ({
  ...baseRoutes(),
  "GET /api/price-book/items": () => json(200, { data: items }),
  "GET /api/price-book/mapping": () => json(200, { data: mappingFor(PRICES) }),
});

function renderSection() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <MemoryRouter>
        <GapStudySection jobId={JOB_ID} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

beforeEach(() => {
  resetCsrfToken();
  roofDraftStore.clearAll();
  localStorage.clear();
});

describe("Gap study section", { timeout: 20_000 }, () => {
  it("renders the five options from a real computeGapStudy run on the default stack's planes", async () => {
    stubApi(routes());
    renderSection();
    const table = await screen.findByRole("table", { name: "Spacer options side by side" });
    const headers = within(table).getAllByRole("columnheader").map((h) => h.textContent);
    expect(headers).toEqual(["Option", "No spacer", "Battens(now)", "Battens on counter-battens", "3D mesh mat", "Dimpled sheet"]);

    const roof = demoRoof();
    const mainIds = roof.planes.filter((p) => p.stackId === "battens").map((p) => p.id);
    const study = computeGapStudy({ site: job.site, planes: roof.planes, stacks: roof.stacks, defaultStackId: roof.defaultStackId, planeIds: mainIds });
    if (!study.ok) throw new Error(study.reason);
    const gapRow = within(table).getByRole("row", { name: /Gap, deck to panel/ });
    // 1x4 dressed 3/4 in, counter-battens 3/4 + 3/4 in (NIST PS 20); mesh 0.3 in, dimpled 0.4 in (common practice)
    expect(within(gapRow).getAllByRole("cell").map((c) => c.textContent)).toEqual(["none", "3/4 in", "1-1/2 in", "0.3 in", "0.4 in"]);
    expect(study.options.map((o) => o.summary.gapIn)).toEqual([0, 0.75, 1.5, 0.3, 0.4]);

    const channelRow = within(table).getByRole("row", { name: /Channel/ });
    const channelCells = within(channelRow).getAllByRole("cell");
    study.options.forEach((o, i) => expect(channelCells[i]).toHaveTextContent(o.summary.qualifies ? "Qualifies" : "Does not qualify"));
    // only battens over counter-battens make a 3/4 in channel: 0.75 × 12 × (1 − 3.5/24) = 7.69 in²/ft
    expect(channelCells[2]).toHaveTextContent("7.7 in²/ft");

    const summerRow = within(table).getByRole("row", { name: /Air-space R, summer/ });
    const summer = within(summerRow).getAllByRole("cell");
    study.options.forEach((o, i) => {
      if (o.summary.airSpaceRSummer === null) expect(summer[i]!.textContent).toMatch(/not applicable — ventilated|no air space/);
      else expect(summer[i]).toHaveTextContent(`R-${o.summary.airSpaceRSummer.toFixed(2)}`);
    });
    expect(summer[2]).toHaveTextContent("not applicable — ventilated");

    // each spacer material by its quantity, purchase unit and description (the price-book key is not shown)
    const materialsRow = within(table).getByRole("row", { name: /Spacer materials/ });
    const countered = within(within(materialsRow).getAllByRole("cell")[2]!).getAllByRole("listitem").map((li) => li.textContent);
    expect(countered).toEqual(study.options[2]!.summary.spacerMaterials.map((m) => `${m.quantity} ${m.unit} · ${m.description}`));
    expect(countered.join(" ")).toMatch(/1x4 counter-battens/);
    expect(within(materialsRow).queryByText(/screw-batten|batten-1x4/)).toBeNull();

    // cost per square: spacer materials × price-book unit cost ÷ squares of the chosen planes
    const costRow = within(table).getByRole("row", { name: /Spacer cost per square/ });
    const battens = study.options[1]!;
    const cents = battens.summary.spacerMaterials.reduce((n, m) => n + m.quantity * PRICES[m.key as keyof typeof PRICES], 0);
    const perSq = Math.round(cents / battens.result.totals.squares);
    expect(within(costRow).getAllByRole("cell")[1]).toHaveTextContent(`$${(perSq / 100).toFixed(2)}`);

    expect(screen.getByTestId("gap-chart")).toBeInTheDocument();
  });

  it("'Use this option' writes the spacer into the stack of the chosen planes", async () => {
    stubApi(routes());
    renderSection();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Use this option: Battens on counter-battens" }));
    const stack = roofDraftStore.get(JOB_ID)!.doc.stacks.find((s) => s.id === "battens")!;
    expect(stack.spacer?.kind).toBe("battens");
    expect(stack.spacer?.battens?.counterBattens).toBe(true);
    // the porch's stack is not on a chosen plane and keeps its mesh
    expect(roofDraftStore.get(JOB_ID)!.doc.stacks.find((s) => s.id === "mesh")!.spacer?.kind).toBe("mesh");
  });

  it("'Add as quote option' patches the draft quote with the existing options kept", async () => {
    const api = stubApi({
      ...routes(),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      [`GET /api/jobs/${JOB_ID}/quotes`]: () =>
        json(200, { data: [{ id: 41, number: "Q-1001", status: "draft", archived: false, updatedAt: "2026-01-02T00:00:00Z", options: [] }] }),
      "GET /api/quotes/41": () =>
        json(200, { data: { id: 41, number: "Q-1001", status: "draft", revision: { version: 4, status: "draft", options: [{ id: 9, label: "As designed", spec: {} }] } } }),
      "PATCH /api/quotes/41": (call) =>
        json(200, { data: { id: 41, number: "Q-1001", status: "draft", revision: { version: 5, status: "draft", options: (call.body as { options: unknown[] }).options } } }),
    });
    renderSection();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Add as quote option: 3D mesh mat" }));
    await waitFor(() => expect(api.callsTo("PATCH /api/quotes/41")).toHaveLength(1));
    expect(api.callsTo("PATCH /api/quotes/41")[0]!.body).toEqual({
      version: 4,
      options: [
        { id: 9, label: "As designed", spec: {} },
        { label: "3D mesh mat", spec: { spacer: "mesh" } },
      ],
    });
  });

  it("starts a quote when the job has no draft quote", async () => {
    const api = stubApi({
      ...routes(),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      [`GET /api/jobs/${JOB_ID}/quotes`]: () => json(200, { data: [] }),
      [`POST /api/jobs/${JOB_ID}/quotes`]: () => json(201, { data: { id: 50, number: "Q-1002", status: "draft", revision: { version: 1, status: "draft", options: [] } } }),
    });
    renderSection();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Add as quote option: Dimpled sheet" }));
    await waitFor(() => expect(api.callsTo(`POST /api/jobs/${JOB_ID}/quotes`)).toHaveLength(1));
    expect(api.callsTo(`POST /api/jobs/${JOB_ID}/quotes`)[0]!.body).toEqual({
      options: [
        { label: "As designed", spec: {} },
        { label: "Dimpled sheet", spec: { spacer: "dimpled" } },
      ],
    });
  });
});
