import { beforeEach, describe, expect, it, vi } from "vitest";
import { act, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import type { UserDto } from "@shared/schemas/auth";
import type { RoofDto } from "@shared/schemas/roof";
import { buildBenchRoof } from "@shared/engine/roof/bench-roof";
import { makeAppQueryClient } from "@/app/provider";
import { toast, Toaster } from "@/components/ui/toast";
import { resetCsrfToken } from "@/lib/api-client";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { RoofSketchSection } from "@/features/roof/components/roof-sketch-section";
import { json, stubApi } from "./fetch-stub";

const JOB_ID = 7;
const estimator: UserDto = { id: 2, email: "estimator@example.com", name: "Sam Example", role: "estimator", companyId: 1 };
const crew: UserDto = { id: 3, email: "crew@example.com", name: "Kit Sample", role: "crew", companyId: 1 };

const job = {
  id: JOB_ID,
  status: "estimating",
  customerId: 1,
  customer: { id: 1, name: "Ada Sample", email: "ada@example.com", phone: null },
  siteAddressLine1: "1 Example Road",
  siteAddressLine2: null,
  siteCity: "Exampleton",
  siteRegion: null,
  sitePostalCode: null,
  site: { atticType: "vented", codeEdition: 2021, ventException: false, coolRoofRequired: false, existingLayers: 1, tearOff: true, wind: { ratedAssemblyRequired: false } },
  notes: null,
  estimatorId: 2,
  estimator: { id: 2, name: "Sam Example" },
  crew: [],
  squares: null,
  archivedAt: null,
  createdAt: "2025-01-02T10:00:00.000Z",
  updatedAt: "2025-01-02T10:00:00.000Z",
};

const emptyRoof: RoofDto = { planes: [], stacks: [], defaultStackId: "", version: 0 };

const stack = { id: "s1", name: "Plain standing seam" } as RoofDto["stacks"][number];
/** One 24 × 12 ft plane at 6/12, eave on edge 0 (the south side). */
const oneRectRoof = (version = 3): RoofDto =>
  ({
    planes: [{ id: "a", name: "Front", pitch: 6, outline: [[0, 0], [24, 0], [24, 12], [0, 12]], eaveEdge: 0, edgeTypes: {}, penetrations: [] }],
    stacks: [stack],
    defaultStackId: "s1",
    version,
  }) as unknown as RoofDto;

/**
 * The drawing opens at 800 × 560 px (jsdom measures nothing). An empty roof is shown at 12 px per foot
 * with the plan origin 48 px in from the left and the bottom: plan (x, y) ft is at (48 + 12x, 512 − 12y) px.
 */
const px = (x: number, y: number) => ({ clientX: 48 + 12 * x, clientY: 512 - 12 * y });

function setup(opts: { roof?: RoofDto; user?: UserDto; routes?: Parameters<typeof stubApi>[0] } = {}) {
  const api = stubApi({
    "GET /api/auth/me": () => json(200, { user: opts.user ?? estimator }),
    [`GET /api/jobs/${JOB_ID}/roof`]: () => json(200, { data: opts.roof ?? emptyRoof }),
    [`GET /api/jobs/${JOB_ID}`]: () => json(200, { data: job }),
    "GET /api/price-book/rules": () => json(200, { data: {} }),
    "GET /api/auth/csrf": () => json(200, { token: "t" }),
    ...opts.routes,
  });
  const qc = makeAppQueryClient();
  render(
    <QueryClientProvider client={qc}>
      <RoofSketchSection jobId={JOB_ID} />
      <Toaster />
    </QueryClientProvider>,
  );
  return { api, qc };
}

/** The plan svg with a fixed on-screen box, so pointer positions map to feet deterministically. */
async function plan() {
  const svg = await screen.findByTestId("roof-plan");
  vi.spyOn(svg, "getBoundingClientRect").mockReturnValue({ left: 0, top: 0, right: 800, bottom: 560, width: 800, height: 560, x: 0, y: 0, toJSON: () => ({}) } as DOMRect);
  return svg;
}

const click = (svg: Element, at: { clientX: number; clientY: number }) => {
  fireEvent.pointerDown(svg, { ...at, button: 0, pointerId: 1 });
  fireEvent.pointerUp(svg, { ...at, button: 0, pointerId: 1 });
};

const draft = () => roofDraftStore.get(JOB_ID)!;

beforeEach(() => {
  // toasts live in a module-level list: clear the ones earlier tests left
  const last = toast.info("");
  for (let id = 1; id <= last; id++) toast.dismiss(id);
  resetCsrfToken();
  roofDraftStore.clearAll();
  localStorage.clear();
});

describe("Roof sketch: drawing", () => {
  it("draws a plane by clicking corners and closing on the first one; the roof gets a default stack and live totals", async () => {
    setup();
    const svg = await plan();
    await userEvent.click(screen.getByRole("button", { name: "Draw plane" }));
    for (const [x, y] of [[0, 0], [20, 0], [20, 10], [0, 10]] as const) click(svg, px(x, y));
    expect(draft().doc.planes).toHaveLength(0); // not closed yet
    click(svg, px(0, 0)); // the first corner closes the outline

    const d = draft();
    expect(d.doc.planes).toHaveLength(1);
    expect(d.doc.planes[0].outline).toEqual([[0, 0], [20, 0], [20, 10], [0, 10]]);
    expect(d.doc.planes[0].pitch).toBe(6);
    expect(d.doc.planes[0].eaveEdge).toBe(0); // the longest edge that can be an eave
    expect(d.dirty).toBe(true);
    expect(d.doc.stacks).toHaveLength(1);
    expect(d.doc.stacks[0]).toMatchObject({
      name: "Main roof",
      underlayment: { kind: "synthetic", highTemp: true },
      spacer: { kind: "none" },
      radiantBarrier: { kind: "none" },
      panel: { system: "standing-seam", coverageWidthIn: 16, gauge: 24, solarReflectance: 0.3, thermalEmittance: 0.85 },
    });
    expect(d.doc.defaultStackId).toBe(d.doc.stacks[0].id);

    // the new plane is selected and the preview computes: 200 ft² plan × √(144 + 36)/12 = 223.6 ft² = 2.24 squares
    expect(await screen.findByRole("heading", { name: "Plane 1" })).toBeInTheDocument();
    const totals = await screen.findByLabelText("Roof totals");
    await waitFor(() => expect(within(totals).getByText("2.24")).toBeInTheDocument());
    expect(within(totals).getByText("224 sq ft")).toBeInTheDocument();
    // 20 ft eave on the south side (the north side is a headwall: nothing above it)
    expect(screen.getByTestId("lf-eave")).toHaveTextContent("20.0 LF");
  });

  it("snaps clicks to the grid: 1 ft, then 6 in; Enter closes the outline", async () => {
    setup();
    const svg = await plan();
    await userEvent.click(screen.getByRole("button", { name: "Draw plane" }));
    click(svg, px(0.3, -0.2));
    click(svg, px(10.4, 0.45));
    await userEvent.selectOptions(screen.getByLabelText("Snap to grid"), "6 in");
    click(svg, px(10.3, 7.7)); // → 10.5, 7.5
    click(svg, px(0.2, 7.4)); // → 0, 7.5
    fireEvent.keyDown(document.body, { key: "Enter" });

    expect(draft().doc.planes[0].outline).toEqual([[0, 0], [10, 0], [10.5, 7.5], [0, 7.5]]);
  });

  it("Shift keeps a drawn edge east–west or north–south; a click near a corner snaps to it", async () => {
    setup({ roof: oneRectRoof() });
    const svg = await plan();
    // the roof was fitted: read the view from corner handles of plane "a" after selecting it
    fireEvent.pointerDown(svg.querySelector('path[data-hit="plane"][data-plane-id="a"]')!, { button: 0, pointerId: 1 });
    const h = (i: number) => {
      const r = svg.querySelector(`rect[data-hit="vertex"][data-plane-id="a"][data-index="${i}"]`)!;
      return [Number(r.getAttribute("x")) + 5, Number(r.getAttribute("y")) + 5] as const;
    };
    const [x0, y0] = h(0); // plan (0, 0)
    const s = (h(1)[0] - x0) / 24; // px per foot
    const at = (x: number, y: number) => ({ clientX: x0 + s * x, clientY: y0 - s * y });
    await userEvent.click(screen.getByRole("button", { name: "Draw plane" }));
    click(svg, { ...at(24, 0), clientX: at(24, 0).clientX + 4 }); // 4 px off the corner: snaps to it
    const shiftClick = (p: { clientX: number; clientY: number }) => {
      fireEvent.pointerDown(svg, { ...p, button: 0, pointerId: 1, shiftKey: true });
      fireEvent.pointerUp(svg, { ...p, button: 0, pointerId: 1, shiftKey: true });
    };
    shiftClick(at(36.2, 2.4)); // → (36, 0): level with the last corner
    shiftClick(at(37.6, -9.1)); // → (36, -9): plumb below it
    fireEvent.keyDown(document.body, { key: "Enter" });
    expect(draft().doc.planes[1].outline).toEqual([[24, 0], [36, 0], [36, -9]]);
  });

  it("Escape cancels the outline being drawn", async () => {
    setup();
    const svg = await plan();
    await userEvent.click(screen.getByRole("button", { name: "Draw plane" }));
    click(svg, px(0, 0));
    click(svg, px(10, 0));
    expect(screen.getByText("2 corners")).toBeInTheDocument();
    fireEvent.keyDown(document.body, { key: "Escape" });
    expect(screen.queryByText("2 corners")).not.toBeInTheDocument();
    expect(draft().doc.planes).toHaveLength(0);
  });

  it("undo and redo with the buttons and with Ctrl+Z / Ctrl+Shift+Z / Ctrl+Y", async () => {
    setup();
    const svg = await plan();
    await userEvent.click(screen.getByRole("button", { name: "Draw plane" }));
    for (const [x, y] of [[0, 0], [12, 0], [12, 8]] as const) click(svg, px(x, y));
    fireEvent.keyDown(document.body, { key: "Enter" });
    expect(draft().doc.planes).toHaveLength(1);

    fireEvent.keyDown(document.body, { key: "z", ctrlKey: true });
    expect(draft().doc.planes).toHaveLength(0);
    fireEvent.keyDown(document.body, { key: "Z", ctrlKey: true, shiftKey: true });
    expect(draft().doc.planes).toHaveLength(1);
    fireEvent.keyDown(document.body, { key: "z", metaKey: true });
    expect(draft().doc.planes).toHaveLength(0);
    fireEvent.keyDown(document.body, { key: "y", ctrlKey: true });
    expect(draft().doc.planes).toHaveLength(1);

    await userEvent.click(screen.getByRole("button", { name: "Undo" }));
    expect(draft().doc.planes).toHaveLength(0);
    expect(screen.getByRole("button", { name: "Undo" })).toBeDisabled();
    await userEvent.click(screen.getByRole("button", { name: "Redo" }));
    expect(draft().doc.planes[0].outline).toEqual([[0, 0], [12, 0], [12, 8]]);
    expect(screen.getByRole("button", { name: "Redo" })).toBeDisabled();
  });

  it("a quick gable adds two planes from the generator, with the ridge typed and measured", async () => {
    setup();
    await plan();
    await userEvent.click(screen.getAllByRole("button", { name: "Quick shape…" })[0]);
    const dialog = await screen.findByRole("dialog", { name: "Add a quick shape" });
    const w = within(dialog);
    await userEvent.clear(w.getByLabelText("Width, east–west (ft)"));
    await userEvent.type(w.getByLabelText("Width, east–west (ft)"), "30");
    await userEvent.clear(w.getByLabelText("Depth, north–south (ft)"));
    await userEvent.type(w.getByLabelText("Depth, north–south (ft)"), "20");
    await userEvent.clear(w.getByLabelText("Pitch (rise in 12)"));
    await userEvent.type(w.getByLabelText("Pitch (rise in 12)"), "8");
    await userEvent.click(w.getByRole("button", { name: "Add planes" }));

    await waitFor(() => expect(draft().doc.planes).toHaveLength(2));
    const [s, n] = draft().doc.planes;
    expect(s).toMatchObject({ name: "South slope", pitch: 8, eaveEdge: 0, outline: [[0, 0], [30, 0], [30, 10], [0, 10]] });
    expect(n).toMatchObject({ name: "North slope", pitch: 8, outline: [[30, 20], [0, 20], [0, 10], [30, 10]] });
    expect(new Set([s.id, n.id]).size).toBe(2);
    expect(screen.queryByRole("dialog")).not.toBeInTheDocument();
    // the shared middle edge is one 30 ft ridge; the eaves are the two 30 ft long sides
    await waitFor(() => expect(screen.getByTestId("lf-ridge")).toHaveTextContent("30.0 LF"));
    expect(screen.getByTestId("lf-eave")).toHaveTextContent("60.0 LF");

    // a second gable does not reuse the ids
    await userEvent.click(screen.getAllByRole("button", { name: "Quick shape…" })[0]);
    await userEvent.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Add planes" }));
    await waitFor(() => expect(draft().doc.planes).toHaveLength(4));
    expect(new Set(draft().doc.planes.map((p) => p.id)).size).toBe(4);
    expect(draft().doc.planes[2].name).toBe("South slope 2");
  });
});

describe("Roof sketch: editing a plane", () => {
  it("picks the eave edge: click an edge on the plan, then 'Make this the eave edge' (and E)", async () => {
    setup({ roof: oneRectRoof() });
    const svg = await plan();
    const edge2 = svg.querySelector('[data-hit="edge"][data-plane-id="a"][data-index="2"]')!;
    fireEvent.pointerDown(edge2, { button: 0, pointerId: 1, clientX: 100, clientY: 100 });
    const group = await screen.findByRole("group", { name: /Edge 3 .* settings/ });
    await userEvent.click(within(group).getByRole("button", { name: "Make this the eave edge" }));
    expect(draft().doc.planes[0].eaveEdge).toBe(2);
    expect(within(screen.getByRole("group", { name: /Edge 3 .* settings/ })).getByText(/This is the plane's eave edge/)).toBeInTheDocument();

    // E on another selected edge
    const edge0 = svg.querySelector('[data-hit="edge"][data-plane-id="a"][data-index="0"]')!;
    fireEvent.pointerDown(edge0, { button: 0, pointerId: 1, clientX: 100, clientY: 100 });
    fireEvent.keyDown(document.body, { key: "e" });
    expect(draft().doc.planes[0].eaveEdge).toBe(0);
  });

  it("sets the pitch (degrees shown), renames and assigns a stack; an edge type can be overridden", async () => {
    setup({ roof: oneRectRoof() });
    const svg = await plan();
    fireEvent.pointerDown(svg.querySelector('path[data-hit="plane"][data-plane-id="a"]')!, { button: 0, pointerId: 1 });
    const pitch = await screen.findByLabelText("Pitch (rise in 12)");
    await userEvent.clear(pitch);
    await userEvent.type(pitch, "12{Enter}");
    expect(draft().doc.planes[0].pitch).toBe(12);
    expect(screen.getByText(/45\.0°/)).toBeInTheDocument();

    await userEvent.clear(pitch);
    await userEvent.type(pitch, "30{Enter}");
    expect(draft().doc.planes[0].pitch).toBe(12); // refused: 0 to 24
    expect(screen.getByText("Use 0 to 24")).toBeInTheDocument();

    const name = screen.getByLabelText("Name");
    await userEvent.clear(name);
    await userEvent.type(name, "Street side{Enter}");
    expect(draft().doc.planes[0].name).toBe("Street side");

    await userEvent.selectOptions(screen.getByLabelText("Layer stack"), "Plain standing seam");
    expect(draft().doc.planes[0].stackId).toBe("s1");

    await userEvent.click(screen.getByRole("button", { name: /Edge 2/ }));
    await userEvent.selectOptions(screen.getByLabelText("Edge type"), "sidewall");
    expect(draft().doc.planes[0].edgeTypes).toEqual({ "1": "sidewall" });
    await userEvent.selectOptions(screen.getByLabelText("Edge type"), "");
    expect(draft().doc.planes[0].edgeTypes).toEqual({});
  });

  it("numeric entry: exact corner coordinates (feet and inches) and an edge's length", async () => {
    setup({ roof: oneRectRoof() });
    const svg = await plan();
    fireEvent.pointerDown(svg.querySelector('path[data-hit="plane"][data-plane-id="a"]')!, { button: 0, pointerId: 1 });
    const x2 = await screen.findByLabelText("Corner 2 x");
    await userEvent.clear(x2);
    await userEvent.type(x2, `24' 6"{Enter}`);
    expect(draft().doc.planes[0].outline[1]).toEqual([24.5, 0]);
    const y3 = screen.getByLabelText("Corner 3 y");
    await userEvent.clear(y3);
    await userEvent.type(y3, "13.25");
    fireEvent.blur(y3);
    expect(draft().doc.planes[0].outline[2]).toEqual([24, 13.25]);

    // edge 1 (corner 1 → 2) set to 30 ft: corner 2 moves along the edge
    await userEvent.click(screen.getByRole("button", { name: /Edge 1/ }));
    const len = screen.getByLabelText("Plan length");
    expect(len).toHaveValue(`24' 6"`);
    await userEvent.clear(len);
    await userEvent.type(len, "30{Enter}");
    expect(draft().doc.planes[0].outline[1]).toEqual([30, 0]);

    await userEvent.clear(len);
    await userEvent.type(len, "abc{Enter}");
    expect(draft().doc.planes[0].outline[1]).toEqual([30, 0]);
    expect(len).toHaveAttribute("aria-invalid", "true");
  });

  it("drags a corner with snapping: live on a small roof, one undo step for the whole drag", async () => {
    setup({ roof: oneRectRoof() });
    const svg = await plan();
    fireEvent.pointerDown(svg.querySelector('path[data-hit="plane"][data-plane-id="a"]')!, { button: 0, pointerId: 1 });
    const before = draft().past.length;
    // the roof was fitted to the drawing: find corner 3 (24, 12) on screen from its handle
    const handle = svg.querySelector('rect[data-hit="vertex"][data-plane-id="a"][data-index="2"]')!;
    const hx = Number(handle.getAttribute("x")) + 5;
    const hy = Number(handle.getAttribute("y")) + 5;
    const x0 = svg.querySelector('rect[data-hit="vertex"][data-plane-id="a"][data-index="0"]')!;
    const scale = (hx - (Number(x0.getAttribute("x")) + 5)) / 24; // px per foot
    fireEvent.pointerDown(handle, { button: 0, pointerId: 5, clientX: hx, clientY: hy });
    const frame = () => act(() => new Promise<void>((r) => requestAnimationFrame(() => r())));
    fireEvent.pointerMove(svg, { pointerId: 5, clientX: hx + scale * 1.2, clientY: hy });
    // a small roof follows the drag once per frame (live totals), snapped to 1 ft
    await frame();
    await frame();
    expect(draft().doc.planes[0].outline[2]).toEqual([25, 12]);
    fireEvent.pointerMove(svg, { pointerId: 5, clientX: hx + scale * 2.1, clientY: hy - scale * 2.9 });
    await frame();
    await frame();
    fireEvent.pointerMove(svg, { pointerId: 5, clientX: hx + scale * 2.2, clientY: hy - scale * 3.1 }); // same snapped point
    fireEvent.pointerUp(svg, { pointerId: 5, clientX: hx + scale * 2.2, clientY: hy - scale * 3.1 });
    expect(draft().doc.planes[0].outline[2]).toEqual([26, 15]);
    expect(draft().past.length).toBe(before + 1); // the whole drag is one undo step
    fireEvent.keyDown(document.body, { key: "z", ctrlKey: true });
    expect(draft().doc.planes[0].outline[2]).toEqual([24, 12]);
  });

  it("on a large roof the drag stays local until release (no draft update, no engine run per move)", async () => {
    const bench = buildBenchRoof(30);
    const roof = { planes: bench.planes, stacks: bench.stacks, defaultStackId: bench.defaultStackId, version: 2 } as unknown as RoofDto;
    setup({ roof });
    const svg = await plan();
    const id = bench.planes[0].id;
    fireEvent.pointerDown(svg.querySelector(`path[data-hit="plane"][data-plane-id="${id}"]`)!, { button: 0, pointerId: 1 });
    const handle = svg.querySelector(`rect[data-hit="vertex"][data-plane-id="${id}"][data-index="0"]`)!;
    const hx = Number(handle.getAttribute("x")) + 5;
    const hy = Number(handle.getAttribute("y")) + 5;
    const docBefore = draft().doc;
    fireEvent.pointerDown(handle, { button: 0, pointerId: 6, clientX: hx, clientY: hy });
    fireEvent.pointerMove(svg, { pointerId: 6, clientX: hx - 40, clientY: hy + 40 });
    await act(() => new Promise<void>((r) => requestAnimationFrame(() => requestAnimationFrame(() => r()))));
    expect(draft().doc).toBe(docBefore);
    fireEvent.pointerUp(svg, { pointerId: 6, clientX: hx - 40, clientY: hy + 40 });
    expect(draft().doc).not.toBe(docBefore);
    expect(draft().doc.planes[0].outline[0]).not.toEqual(bench.planes[0].outline[0]);
    expect(draft().past).toHaveLength(1);
  });

  it("adds and removes a penetration, and deletes the plane", async () => {
    setup({ roof: oneRectRoof() });
    const svg = await plan();
    fireEvent.pointerDown(svg.querySelector('path[data-hit="plane"][data-plane-id="a"]')!, { button: 0, pointerId: 1 });
    await userEvent.selectOptions(await screen.findByLabelText("Kind"), "chimney");
    const width = screen.getByLabelText("Width across slope (in)");
    await userEvent.clear(width);
    await userEvent.type(width, "32");
    await userEvent.click(screen.getByRole("button", { name: "Add" }));
    expect(draft().doc.planes[0].penetrations).toEqual([{ kind: "chimney", count: 1, widthIn: 32 }]);
    const list = screen.getByRole("list", { name: "Penetrations on Front" });
    expect(within(list).getByText(/Chimney · 32 in across/)).toBeInTheDocument();
    await userEvent.click(within(list).getByRole("button", { name: /Remove/ }));
    expect(draft().doc.planes[0].penetrations).toEqual([]);

    await userEvent.click(screen.getByRole("button", { name: "Delete plane" }));
    expect(draft().doc.planes).toHaveLength(0);
  });

  it("shows the engine's refusal and points at the plane instead of crashing", async () => {
    // the eave on the notch's inner edge: corners lie on the outer side of the eave line
    const roof = {
      ...oneRectRoof(),
      planes: [{ id: "u", name: "Notched", pitch: 6, outline: [[0, 0], [10, 0], [10, 10], [5, 5], [0, 10]], eaveEdge: 2, edgeTypes: {}, penetrations: [] }],
    } as unknown as RoofDto;
    setup({ roof });
    await plan();
    expect(await screen.findByText("The roof doesn't compute yet")).toBeInTheDocument();
    expect(screen.getByText(/^Notched:/)).toBeInTheDocument();
    await userEvent.click(screen.getByRole("button", { name: "Show the plane" }));
    expect(screen.getByRole("heading", { name: "Notched" })).toBeInTheDocument();
    expect(screen.getByTestId("roof-plan").querySelector('path[data-plane-id="u"]')).toHaveAttribute("stroke", "#b42318");
  });

  it("the table view edits pitch and name by numbers", async () => {
    setup({ roof: oneRectRoof() });
    await plan();
    await userEvent.click(screen.getByRole("button", { name: "Table" }));
    const table = screen.getByRole("table", { name: "Roof planes" });
    const pitch = within(table).getByLabelText("Pitch of Front");
    await userEvent.clear(pitch);
    await userEvent.type(pitch, "4{Enter}");
    expect(draft().doc.planes[0].pitch).toBe(4);
    await userEvent.selectOptions(within(table).getByLabelText("Eave edge of Front"), "2");
    expect(draft().doc.planes[0].eaveEdge).toBe(2);
    // 288 ft² plan × √(144 + 16)/12 = 303.6 ft²
    expect(within(table).getAllByText("304").length).toBeGreaterThan(0);
  });
});

describe("Roof sketch: saving", () => {
  it("saves with the loaded version and shows Saved; a 409 offers to reload theirs", async () => {
    const theirs = { ...oneRectRoof(4), planes: [{ ...oneRectRoof().planes[0], name: "Their edit", pitch: 9 }] } as RoofDto;
    const { api } = setup({
      roof: oneRectRoof(3),
      routes: {
        [`GET /api/jobs/${JOB_ID}/roof`]: [() => json(200, { data: oneRectRoof(3) }), () => json(200, { data: theirs })],
        [`PUT /api/jobs/${JOB_ID}/roof`]: () => json(409, { error: { code: "conflict", message: "The roof was changed by someone else" } }),
      },
    });
    await plan();
    expect(await screen.findByText("Saved")).toBeInTheDocument();
    await act(async () => roofDraftStore.update(JOB_ID, (d) => ({ ...d, planes: d.planes.map((p) => ({ ...p, pitch: 7 })) })));
    expect(screen.getByText("Unsaved changes")).toBeInTheDocument();

    fireEvent.keyDown(document.body, { key: "s", ctrlKey: true });
    expect(await screen.findByText("Changed by someone else")).toBeInTheDocument();
    expect(api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)[0].body).toMatchObject({ version: 3, planes: [{ pitch: 7 }] });
    expect(draft().doc.planes[0].pitch).toBe(7); // mine kept
    expect(draft().dirty).toBe(true);

    await userEvent.click(screen.getByRole("button", { name: "Reload theirs (discard mine)" }));
    await waitFor(() => expect(draft().doc.planes[0].name).toBe("Their edit"));
    expect(draft().baseVersion).toBe(4);
    expect(draft().dirty).toBe(false);
    expect(screen.queryByText("Changed by someone else")).not.toBeInTheDocument();
    expect(screen.queryByText("Your unsaved changes are on an older version of this roof")).not.toBeInTheDocument();
  });

  it("after a 409, 'Overwrite with mine' saves my drawing on top of the newer version", async () => {
    const saved = { ...oneRectRoof(5), takeoff: null };
    const { api } = setup({
      roof: oneRectRoof(3),
      routes: {
        [`GET /api/jobs/${JOB_ID}/roof`]: [() => json(200, { data: oneRectRoof(3) }), () => json(200, { data: oneRectRoof(4) })],
        [`PUT /api/jobs/${JOB_ID}/roof`]: [() => json(409, { error: { code: "conflict", message: "Changed" } }), () => json(200, { data: saved })],
        "GET /api/jobs": () => json(200, { data: [], meta: { page: 1, pageSize: 25, total: 0 } }),
      },
    });
    const svg = await plan();
    fireEvent.pointerDown(svg.querySelector('path[data-hit="plane"][data-plane-id="a"]')!, { button: 0, pointerId: 1 });
    // a pitch typed and not yet committed is included when Ctrl+S is pressed in the field
    const pitch = await screen.findByLabelText("Pitch (rise in 12)");
    await userEvent.clear(pitch);
    await userEvent.type(pitch, "9");
    fireEvent.keyDown(pitch, { key: "s", ctrlKey: true });
    expect(await screen.findByText("Changed by someone else")).toBeInTheDocument();
    expect(api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)[0].body).toMatchObject({ version: 3, planes: [{ pitch: 9 }] });

    await userEvent.click(screen.getByRole("button", { name: "Overwrite with mine" }));
    await waitFor(() => expect(api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)).toHaveLength(2));
    expect(api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)[1].body).toMatchObject({ version: 4, planes: [{ pitch: 9 }] });
    await waitFor(() => expect(draft().baseVersion).toBe(5));
    expect(draft().dirty).toBe(false);
    expect(screen.queryByText("Your unsaved changes are on an older version of this roof")).not.toBeInTheDocument();
  });

  it("a successful save marks the draft saved; a failed one keeps it", async () => {
    const saved = { ...oneRectRoof(4), planes: [{ ...oneRectRoof().planes[0], pitch: 5 }], takeoff: null };
    const { api } = setup({
      roof: oneRectRoof(3),
      routes: {
        [`PUT /api/jobs/${JOB_ID}/roof`]: [() => json(500, { error: { code: "server_error", message: "Database unavailable" } }), () => json(200, { data: saved })],
        "GET /api/jobs": () => json(200, { data: [], meta: { page: 1, pageSize: 25, total: 0 } }),
      },
    });
    await plan();
    await act(async () => roofDraftStore.update(JOB_ID, (d) => ({ ...d, planes: d.planes.map((p) => ({ ...p, pitch: 5 })) })));
    await userEvent.click(screen.getByRole("button", { name: "Save" }));
    expect(await screen.findByText(/Not saved: Database unavailable/)).toBeInTheDocument();
    expect(draft().dirty).toBe(true);
    expect(JSON.parse(localStorage.getItem(`ridgewright:roof-draft:${JOB_ID}`)!).doc.planes[0].pitch).toBe(5);

    await userEvent.click(screen.getByRole("button", { name: "Save" }));
    expect(await screen.findByText("Roof saved.")).toBeInTheDocument();
    expect(api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)).toHaveLength(2);
    expect(draft().dirty).toBe(false);
    expect(draft().baseVersion).toBe(4);
    expect(screen.getByText("Saved")).toBeInTheDocument();
  });

  it("offers to resume or discard unsaved changes made on an older version", async () => {
    const mine = { ...oneRectRoof(), planes: [{ ...oneRectRoof().planes[0], name: "My old edit" }] };
    localStorage.setItem(
      `ridgewright:roof-draft:${JOB_ID}`,
      JSON.stringify({ baseVersion: 2, doc: { planes: mine.planes, stacks: mine.stacks, defaultStackId: "s1" }, changedAt: "2025-01-01T10:00:00.000Z" }),
    );
    setup({ roof: oneRectRoof(3) });
    expect(await screen.findByText("Your unsaved changes are on an older version of this roof")).toBeInTheDocument();
    expect(draft().doc.planes[0].name).toBe("Front");
    await userEvent.click(screen.getByRole("button", { name: "Resume my unsaved changes" }));
    expect(draft().doc.planes[0].name).toBe("My old edit");
    expect(draft().baseVersion).toBe(3);
    expect(draft().dirty).toBe(true);
    expect(screen.queryByText("Your unsaved changes are on an older version of this roof")).not.toBeInTheDocument();
  });
});

describe("Roof sketch: view and help", () => {
  it("zooms with the buttons and keys, pans by dragging empty space, and lists the shortcuts on ?", async () => {
    setup();
    const svg = await plan();
    // empty roof at 12 px/ft: the scale bar picks 10 ft (the first round length of 90 px or more)
    expect(within(svg).getByRole("img", { name: "Scale: the bar is 10 feet" })).toBeInTheDocument();
    await userEvent.click(screen.getByRole("button", { name: "Zoom in" })); // 15 px/ft → 10 ft
    await userEvent.click(screen.getByRole("button", { name: "Zoom in" })); // 18.75 px/ft → 5 ft
    expect(within(svg).getByRole("img", { name: "Scale: the bar is 5 feet" })).toBeInTheDocument();
    fireEvent.keyDown(document.body, { key: "-" });
    fireEvent.keyDown(document.body, { key: "-" });
    fireEvent.keyDown(document.body, { key: "-" }); // 9.6 px/ft → 10 ft
    expect(within(svg).getByRole("img", { name: "Scale: the bar is 10 feet" })).toBeInTheDocument();

    // a pan, then 0 fits the (empty) roof: back to the start view, so clicks map as before
    const bg = svg.querySelector('[data-hit="background"]')!;
    fireEvent.pointerDown(bg, { button: 0, pointerId: 2, clientX: 300, clientY: 300 });
    fireEvent.pointerMove(svg, { pointerId: 2, clientX: 360, clientY: 300 });
    fireEvent.pointerMove(svg, { pointerId: 2, clientX: 420, clientY: 300 });
    fireEvent.pointerUp(svg, { pointerId: 2, clientX: 420, clientY: 300 });
    fireEvent.keyDown(document.body, { key: "0" }); // fit: an empty roof goes back to the start view
    await userEvent.click(screen.getByRole("button", { name: "Draw plane" }));
    for (const [x, y] of [[0, 0], [5, 0], [5, 5]] as const) click(svg, px(x, y));
    fireEvent.keyDown(document.body, { key: "Enter" });
    expect(draft().doc.planes[0].outline).toEqual([[0, 0], [5, 0], [5, 5]]);

    fireEvent.keyDown(document.body, { key: "?" });
    const help = await screen.findByRole("dialog", { name: "Roof sketch: keys and gestures" });
    expect(within(help).getByText("Undo")).toBeInTheDocument();
    expect(within(help).getByText(/Save the roof/)).toBeInTheDocument();
  });

  it("panning moves the plan under the pointer", async () => {
    setup();
    const svg = await plan();
    const bg = svg.querySelector('[data-hit="background"]')!;
    fireEvent.pointerDown(bg, { button: 0, pointerId: 2, clientX: 300, clientY: 300 });
    fireEvent.pointerMove(svg, { pointerId: 2, clientX: 420, clientY: 300 });
    fireEvent.pointerUp(svg, { pointerId: 2, clientX: 420, clientY: 300 });
    await userEvent.click(screen.getByRole("button", { name: "Draw plane" }));
    // 120 px = 10 ft at 12 px/ft: the screen point of plan (10, 0) now shows plan (0, 0)
    for (const [x, y] of [[10, 0], [20, 0], [20, 10]] as const) click(svg, px(x, y));
    fireEvent.keyDown(document.body, { key: "Enter" });
    expect(draft().doc.planes[0].outline).toEqual([[0, 0], [10, 0], [10, 10]]);
  });
});

describe("Roof sketch: crew", () => {
  it("crew get a read-only drawing without editing controls and without the price-book rules", async () => {
    const { api } = setup({ roof: oneRectRoof(), user: crew });
    const svg = await plan();
    expect(await screen.findByText("Read only")).toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Draw plane" })).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Save" })).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Undo" })).not.toBeInTheDocument();
    fireEvent.pointerDown(svg.querySelector('path[data-hit="plane"][data-plane-id="a"]')!, { button: 0, pointerId: 1 });
    expect(await screen.findByRole("heading", { name: "Front" })).toBeInTheDocument();
    expect(screen.queryByLabelText("Pitch (rise in 12)")).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Delete plane" })).not.toBeInTheDocument();
    fireEvent.keyDown(document.body, { key: "Delete" });
    expect(draft().doc.planes).toHaveLength(1);
    expect(api.callsTo("GET /api/price-book/rules")).toHaveLength(0);
  });
});
