import { beforeEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import type { AttachmentDto } from "@shared/schemas/attachment";
import type { UserDto } from "@shared/schemas/auth";
import { roofSaveSchema, underlaySchema, type RoofDto, type Underlay } from "@shared/schemas/roof";
import { makeAppQueryClient } from "@/app/provider";
import { toast, Toaster } from "@/components/ui/toast";
import { resetCsrfToken } from "@/lib/api-client";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { RoofSketchSection } from "@/features/roof/components/roof-sketch-section";
import { parseFeet, toView, type Pt, type View } from "@/features/roof/sketch/geometry";
import {
  imageToPlan,
  initialPlacement,
  moveUnderlay,
  normaliseDeg,
  pixelToPlan,
  planToImage,
  planToPixel,
  rotateUnderlay,
  scaleFromTwoPoints,
  underlayMatrix,
  type Placement,
} from "@/features/roof/sketch/underlay-math";
import { json, stubApi } from "./fetch-stub";

const close = (a: readonly number[], b: readonly number[], digits = 6) => {
  expect(a).toHaveLength(b.length);
  a.forEach((v, i) => expect(v).toBeCloseTo(b[i]!, digits));
};

/** An 800 × 600 px plan drawn at 20 px = 1 ft; its rectangle's bottom corners are at (200, 450) and (600, 450) px. */
const SIZE = { width: 800, height: 600 };
const BL: Pt = [200, 450];
const BR: Pt = [600, 450];

describe("underlay maths", () => {
  it("maps image pixels to plan feet and back, y up the plan and down the picture", () => {
    const u: Placement = { originFt: [10, 5], widthFt: 40, rotationDeg: 0 };
    // 40 ft over 800 px: 0.05 ft per px; the picture's bottom-left pixel is the origin
    close(pixelToPlan(u, SIZE, [0, 600]), [10, 5]);
    close(pixelToPlan(u, SIZE, [800, 600]), [50, 5]);
    close(pixelToPlan(u, SIZE, [0, 0]), [10, 35]); // the top edge is 600 px × 0.05 = 30 ft north
    close(pixelToPlan(u, SIZE, BL), [20, 12.5]);
    const turned: Placement = { originFt: [3, -2], widthFt: 55, rotationDeg: 37 };
    for (const p of [[0, 0], [123, 456], [800, 600], BR] as Pt[]) close(planToPixel(turned, SIZE, pixelToPlan(turned, SIZE, p)), p);
    close(planToImage(turned, imageToPlan(turned, [0.3, 0.6])), [0.3, 0.6]);
  });

  it("turns counter-clockwise about the lower-left corner", () => {
    const u: Placement = { originFt: [0, 0], widthFt: 40, rotationDeg: 90 };
    // the bottom edge of the picture now runs north from the origin
    close(pixelToPlan(u, SIZE, [800, 600]), [0, 40]);
    close(pixelToPlan(u, SIZE, [0, 0]), [-30, 0]);
  });

  it("sets the scale from two clicked points and a typed distance, keeping the first point in place", () => {
    const u: Placement = { originFt: [0, 0], widthFt: 100, rotationDeg: 0 };
    const first = pixelToPlan(u, SIZE, BL);
    const second = pixelToPlan(u, SIZE, BR);
    const r = scaleFromTwoPoints(u, first, second, parseFeet("20'")!);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // 400 px are 20 ft, so the 800 px picture is 40 ft wide
    expect(r.placement.widthFt).toBeCloseTo(40, 6);
    close(pixelToPlan(r.placement, SIZE, BL), first, 3);
    const movedSecond = pixelToPlan(r.placement, SIZE, BR);
    expect(Math.hypot(movedSecond[0] - first[0], movedSecond[1] - first[1])).toBeCloseTo(20, 3);
    // a 400 × 300 px rectangle is then 20 × 15 ft
    const top = pixelToPlan(r.placement, SIZE, [200, 150]);
    expect(top[1] - first[1]).toBeCloseTo(15, 3);
  });

  it("takes feet and inches, and works on a turned plan with points not level on the picture", () => {
    const u: Placement = { originFt: [12, -4], widthFt: 63, rotationDeg: -28 };
    const a: Pt = [100, 500];
    const b: Pt = [400, 100]; // 300 × 400 px apart: 500 px
    const r = scaleFromTwoPoints(u, pixelToPlan(u, SIZE, a), pixelToPlan(u, SIZE, b), parseFeet(`20' 6"`)!);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // 500 px = 20.5 ft → 800 px = 32.8 ft
    expect(r.placement.widthFt).toBeCloseTo(32.8, 3);
    expect(r.placement.rotationDeg).toBe(-28);
    close(pixelToPlan(r.placement, SIZE, a), pixelToPlan(u, SIZE, a), 3);
    const pa = pixelToPlan(r.placement, SIZE, a);
    const pb = pixelToPlan(r.placement, SIZE, b);
    expect(Math.hypot(pb[0] - pa[0], pb[1] - pa[1])).toBeCloseTo(20.5, 3);
  });

  it("refuses two clicks at the same place and a distance of 0", () => {
    const u: Placement = { originFt: [0, 0], widthFt: 40, rotationDeg: 0 };
    expect(scaleFromTwoPoints(u, [5, 5], [5, 5], 20)).toMatchObject({ ok: false, error: expect.stringMatching(/same place/) });
    expect(scaleFromTwoPoints(u, [5, 5], [9, 5], 0)).toMatchObject({ ok: false, error: expect.stringMatching(/more than 0/) });
    expect(scaleFromTwoPoints(u, [5, 5], [5.000001, 5], 1e6)).toMatchObject({ ok: false });
  });

  it("draws the picture through the view's y-flip: the matrix puts its corners where the plan says", () => {
    const view: View = { scale: 12, ox: 48, oy: 512 };
    const apply = (m: number[], [x, y]: Pt): Pt => [m[0]! * x + m[2]! * y + m[4]!, m[1]! * x + m[3]! * y + m[5]!];
    for (const u of [
      { originFt: [2, 3], widthFt: 40, rotationDeg: 0 },
      { originFt: [-6, 8], widthFt: 25, rotationDeg: 30 },
    ] as Placement[]) {
      const m = underlayMatrix(view, u, SIZE);
      for (const p of [[0, 0], [800, 0], [800, 600], [0, 600], BL] as Pt[]) close(apply(m, p), toView(view, pixelToPlan(u, SIZE, p)));
    }
    // unturned: the top-left pixel is above (smaller screen y) the bottom-left one
    const m = underlayMatrix(view, { originFt: [0, 0], widthFt: 40, rotationDeg: 0 }, SIZE);
    expect(apply(m, [0, 0])[1]).toBeLessThan(apply(m, [0, 600])[1]);
  });

  it("turns about the picture's centre, moves by plan feet, and folds angles into −180…180", () => {
    const u: Placement = { originFt: [0, 0], widthFt: 40, rotationDeg: 0 };
    const centre = pixelToPlan(u, SIZE, [400, 300]);
    const turned = rotateUnderlay(u, 45, SIZE.height / SIZE.width);
    expect(turned.rotationDeg).toBe(45);
    close(pixelToPlan(turned, SIZE, [400, 300]), centre, 3);
    expect(turned.widthFt).toBe(40);
    expect(moveUnderlay(u, 2.5, -1).originFt).toEqual([2.5, -1]);
    expect(normaliseDeg(270)).toBe(-90);
    expect(normaliseDeg(-190)).toBe(170);
    expect(normaliseDeg(45)).toBe(45);
  });

  it("the page is optional in the roof document (documents saved before it still load; the sketch reads it as page 1)", () => {
    const old = underlaySchema.parse({ src: "/api/attachments/4/file", widthFt: 40 });
    expect(old).not.toHaveProperty("page");
    expect(underlaySchema.safeParse({ src: "/api/attachments/4/file", widthFt: 40, page: 0 }).success).toBe(false);
    expect(underlaySchema.parse({ src: "/api/attachments/4/file", widthFt: 40, page: 3 }).page).toBe(3);
  });
});

// ---- the panel in the Roof sketch ----

const JOB_ID = 7;
const estimator: UserDto = { id: 2, email: "estimator@example.com", name: "Sam Example", role: "estimator", companyId: 1 };
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

const attachment = (id: number, name: string, mime: string): AttachmentDto => ({
  id,
  jobId: JOB_ID,
  kind: "plan",
  originalName: name,
  mime,
  size: 20_000,
  width: mime.startsWith("image/") ? 800 : null,
  height: mime.startsWith("image/") ? 600 : null,
  caption: "",
  showInProposal: false,
  forCrew: false,
  status: "ready",
  error: null,
  uploadedBy: { id: 2, name: "Sam Example" },
  fileUrl: `/api/attachments/${id}/file`,
  thumbUrl: null,
  createdAt: "2025-01-02T10:00:00.000Z",
  updatedAt: "2025-01-02T10:00:00.000Z",
});
const plans = [attachment(41, "ground-floor-plan.png", "image/png"), attachment(42, "plan-set.pdf", "application/pdf")];

const emptyRoof: RoofDto = { planes: [], stacks: [], defaultStackId: "", version: 0 };
const stack = { id: "s1", name: "Plain standing seam" } as RoofDto["stacks"][number];
const oneRectRoof = (version = 3, underlay?: Underlay): RoofDto =>
  ({
    planes: [{ id: "a", name: "Front", pitch: 6, outline: [[0, 0], [24, 0], [24, 12], [0, 12]], eaveEdge: 0, edgeTypes: {}, penetrations: [] }],
    stacks: [stack],
    defaultStackId: "s1",
    version,
    ...(underlay ? { underlay } : {}),
  }) as unknown as RoofDto;

function setup(opts: { roof?: RoofDto; routes?: Parameters<typeof stubApi>[0] } = {}) {
  const api = stubApi({
    "GET /api/auth/me": () => json(200, { user: estimator }),
    [`GET /api/jobs/${JOB_ID}/roof`]: () => json(200, { data: opts.roof ?? emptyRoof }),
    [`GET /api/jobs/${JOB_ID}`]: () => json(200, { data: job }),
    [`GET /api/jobs/${JOB_ID}/attachments`]: () => json(200, { data: plans, meta: { page: 1, pageSize: 2, total: 2 } }),
    // jsdom cannot decode pictures: the plan's bytes arrive, showing it is the browser test's job
    "GET /api/attachments/41/file": () => new Response(new Uint8Array([0x89, 0x50, 0x4e, 0x47]), { headers: { "Content-Type": "image/png" } }),
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

/** An empty roof opens at 12 px per foot, plan origin at (48, 512) px: plan (x, y) ft is (48 + 12x, 512 − 12y) px. */
const px = (x: number, y: number) => ({ clientX: 48 + 12 * x, clientY: 512 - 12 * y });

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
  const last = toast.info("");
  for (let id = 1; id <= last; id++) toast.dismiss(id);
  resetCsrfToken();
  roofDraftStore.clearAll();
  localStorage.clear();
});

describe("Roof sketch: the Underlay panel", () => {
  it("places an uploaded plan, sets its scale from two clicks and a typed distance, and writes it into the draft", async () => {
    const { api } = setup();
    const svg = await plan();
    await userEvent.click(screen.getByRole("button", { name: "Underlay" }));
    const picker = await screen.findByLabelText("Plan file");
    await waitFor(() => expect(screen.getByRole("option", { name: "ground-floor-plan.png" })).toBeInTheDocument());
    expect(api.callsTo(`GET /api/jobs/${JOB_ID}/attachments`)[0].path).toBe(`/api/jobs/${JOB_ID}/attachments?kind=plan`);
    await userEvent.selectOptions(picker, "41");

    // placed across most of the 800 px drawing at 12 px/ft: 640 px ≈ 53 ft, lower-left near (80, 504) px = (3, 1) ft
    expect(draft().doc.underlay).toEqual({ src: "/api/attachments/41/file", page: 1, originFt: [3, 1], widthFt: 53, rotationDeg: 0, opacity: 0.6, visible: true });
    expect(draft().dirty).toBe(true);

    await userEvent.click(screen.getByRole("button", { name: "Set scale from two points" }));
    click(svg, px(5, 2));
    click(svg, px(25, 2)); // 20 ft apart as placed now
    const distance = await screen.findByLabelText("Real distance between the points");
    await userEvent.type(distance, "10'");
    await userEvent.click(screen.getByRole("button", { name: "Apply" }));

    // 20 ft as placed (of 53) is really 10 ft: the plan is 53 × 10 / 20 = 26.5 ft wide, and the first point
    // (5, 2) stays: origin = (5, 2) − ((5, 2) − (3, 1)) × 26.5 / 53 = (4, 1.5)
    const u = draft().doc.underlay!;
    expect(u.widthFt).toBeCloseTo(26.5, 6);
    close(u.originFt, [4, 1.5]);
    expect(u.rotationDeg).toBe(0);
    // drawing clicks are planes again once the scale is set
    expect(screen.queryByLabelText("Real distance between the points")).not.toBeInTheDocument();
    expect(draft().doc.planes).toHaveLength(0);

    // one undo step takes the scale back
    fireEvent.keyDown(window, { key: "z", ctrlKey: true });
    expect(draft().doc.underlay!.widthFt).toBe(53);
  });

  it("refuses a distance it cannot read and keeps the points", async () => {
    setup();
    const svg = await plan();
    await userEvent.click(screen.getByRole("button", { name: "Underlay" }));
    await waitFor(() => expect(screen.getByRole("option", { name: "ground-floor-plan.png" })).toBeInTheDocument());
    await userEvent.selectOptions(screen.getByLabelText("Plan file"), "41");
    await userEvent.click(screen.getByRole("button", { name: "Set scale from two points" }));
    click(svg, px(5, 2));
    click(svg, px(25, 2));
    await userEvent.type(await screen.findByLabelText("Real distance between the points"), "twenty");
    await userEvent.click(screen.getByRole("button", { name: "Apply" }));
    expect(screen.getByText(/Enter the distance in feet/)).toBeInTheDocument();
    expect(draft().doc.underlay!.widthFt).toBe(53);
  });

  it("a PDF plan keeps its file URL and the page; the rotation, opacity and move controls change the draft; the save sends it", async () => {
    const saved = { ...oneRectRoof(4), takeoff: null };
    const { api } = setup({
      roof: oneRectRoof(3),
      routes: {
        "GET /api/attachments/42/file": () => json(404, { error: { code: "not_found", message: "Not found" } }),
        [`PUT /api/jobs/${JOB_ID}/roof`]: () => json(200, { data: saved }),
        "GET /api/jobs": () => json(200, { data: [], meta: { page: 1, pageSize: 25, total: 0 } }),
      },
    });
    await plan();
    await userEvent.click(screen.getByRole("button", { name: "Underlay" }));
    await waitFor(() => expect(screen.getByRole("option", { name: "plan-set.pdf (PDF)" })).toBeInTheDocument());
    await userEvent.selectOptions(screen.getByLabelText("Plan file"), "42");
    expect(draft().doc.underlay).toMatchObject({ src: "/api/attachments/42/file", page: 1 });

    const page = await screen.findByLabelText("PDF page");
    await userEvent.clear(page);
    await userEvent.type(page, "3{Enter}");
    expect(draft().doc.underlay!.page).toBe(3);
    // the file is gone on the server: the panel says so
    expect(await screen.findByText(/was not found/)).toBeInTheDocument();

    const rotation = screen.getByLabelText("Rotation (degrees, counter-clockwise)");
    await userEvent.clear(rotation);
    await userEvent.type(rotation, "390{Enter}");
    expect(draft().doc.underlay!.rotationDeg).toBe(30); // folded into −180…180

    fireEvent.change(screen.getByLabelText("Opacity"), { target: { value: "0.35" } });
    expect(draft().doc.underlay!.opacity).toBe(0.35);

    const before = draft().doc.underlay!.originFt;
    const east = screen.getByLabelText("Plan position x (east), feet");
    await userEvent.clear(east);
    await userEvent.type(east, `${before[0] + 2}' 6"{Enter}`);
    expect(draft().doc.underlay!.originFt[0]).toBeCloseTo(before[0] + 2.5, 3);

    await userEvent.click(screen.getByLabelText("Show the plan"));
    expect(draft().doc.underlay!.visible).toBe(false);

    await userEvent.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)).toHaveLength(1));
    const body = api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)[0].body as Record<string, unknown>;
    expect(body.underlay).toEqual(draft().doc.underlay);
    expect(body.underlay).toMatchObject({ src: "/api/attachments/42/file", page: 3, rotationDeg: 30, opacity: 0.35, visible: false });
    // what the client sends is what the server accepts
    expect(roofSaveSchema.safeParse(body).success).toBe(true);
  });

  it("shows a saved underlay from the server and removes it with null (so the save removes it there too)", async () => {
    const underlay: Underlay = { src: "/api/attachments/41/file", page: 1, originFt: [1, 2], widthFt: 40, rotationDeg: 0, opacity: 0.5, visible: true };
    setup({ roof: oneRectRoof(3, underlay) });
    await plan();
    await userEvent.click(screen.getByRole("button", { name: "Underlay" }));
    expect(await screen.findByLabelText("Plan width (feet)")).toHaveValue(`40' 0"`);
    expect(draft().doc.underlay).toEqual(underlay);
    await userEvent.click(screen.getByRole("button", { name: "Remove the underlay" }));
    expect(draft().doc.underlay).toBeNull();
  });

  it("places a new plan where the drawing is", () => {
    const view: View = { scale: 10, ox: 100, oy: 500 };
    const p = initialPlacement(view, { width: 1000, height: 600 });
    expect(p.widthFt).toBe(80); // 80 % of 1000 px at 10 px/ft
    expect(p.originFt).toEqual([0, -4]); // (100 px, 540 px) on screen
  });
});
