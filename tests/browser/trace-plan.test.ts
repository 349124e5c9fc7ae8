/**
 * Tracing over a plan: the estimator uploads a plan drawing through the sketch's Underlay panel, sets its
 * scale from two clicked points and a typed distance, traces a plane over it, and the live totals show the
 * drawn rectangle's real area. The saved roof keeps the underlay.
 *
 * The plan is made here: an 800 × 600 px white sheet with a 400 × 300 px rectangle drawn at 20 px = 1 ft,
 * so the rectangle is 20 × 15 ft = 300 sq ft on the plan.
 */
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, newPage, shot, signIn } from "./browser";

const W = 800;
const H = 600;
/** The rectangle's corners in image pixels (x right, y down): bottom-left, bottom-right, top-right, top-left. */
const CORNERS: [number, number][] = [
  [200, 450],
  [600, 450],
  [600, 150],
  [200, 150],
];
const PX_PER_FT = 20;
const PLAN_FILE = path.resolve("test-results/trace-plan/plan-20px-per-ft.png");

async function makePlan() {
  mkdirSync(path.dirname(PLAN_FILE), { recursive: true });
  const [[x0, y1], [x1], , [, y0]] = CORNERS;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}">
    <rect width="100%" height="100%" fill="white"/>
    <rect x="${x0}" y="${y0}" width="${x1 - x0}" height="${y1 - y0}" fill="none" stroke="black" stroke-width="2"/>
    <line x1="${x0}" y1="${y1 + 40}" x2="${x1}" y2="${y1 + 40}" stroke="black" stroke-width="1"/>
    <text x="${(x0 + x1) / 2}" y="${y1 + 34}" font-family="sans-serif" font-size="16" text-anchor="middle">20'-0"</text>
    <text x="${x1 + 12}" y="${(y0 + y1) / 2}" font-family="sans-serif" font-size="16">15'-0"</text>
    <line x1="40" y1="560" x2="${40 + 5 * PX_PER_FT}" y2="560" stroke="black" stroke-width="3"/>
    <text x="40" y="585" font-family="sans-serif" font-size="14">SCALE: ${PX_PER_FT} px = 1 ft (bar 5 ft)</text>
    <text x="${x0}" y="${y0 - 12}" font-family="sans-serif" font-size="16">GARAGE ROOF, PLAN VIEW</text>
  </svg>`;
  await sharp(Buffer.from(svg)).png().toFile(PLAN_FILE);
  const meta = await sharp(PLAN_FILE).metadata();
  expect([meta.width, meta.height]).toEqual([W, H]);
}

/** A demo job with nothing drawn yet (a lead), so the totals are the traced plane's alone. */
async function emptyRoofJob(page: Page): Promise<number> {
  const list = (await (await page.request.get("/api/jobs?status=lead&pageSize=50")).json()) as { data: { id: number }[] };
  for (const j of list.data) {
    const roof = (await (await page.request.get(`/api/jobs/${j.id}/roof`)).json()) as { data: { planes: unknown[] } };
    if (roof.data.planes.length === 0) return j.id;
  }
  throw new Error("No demo job without a roof: the demo data should have lead jobs with nothing drawn");
}

/** Where an image pixel is on the page, from the drawn `<image>`'s box (the plan is not turned). */
async function pixelOnPage(page: Page, [x, y]: [number, number]) {
  const box = await page.getByTestId("underlay-image").boundingBox();
  if (!box) throw new Error("The underlay image is not on the page");
  return { x: box.x + (x * box.width) / W, y: box.y + (y * box.height) / H };
}

async function planArea(page: Page): Promise<number> {
  const stat = page.getByLabel("Roof totals").locator("div", { hasText: "Plan area" }).locator("dd");
  const text = (await stat.innerText()).replace(/[^\d.]/g, "");
  return Number(text);
}

let browser: Browser;
beforeAll(async () => {
  await makePlan();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("tracing over a plan in the roof sketch", () => {
  it("uploads a plan, sets its scale from two points and 20', traces the rectangle: 300 sq ft on the plan", async () => {
    const page = await newPage(browser);
    const failed: string[] = [];
    page.on("pageerror", (e) => failed.push(String(e)));
    await signIn(page, "estimator@example.com");
    const jobId = await emptyRoofJob(page);
    await page.goto(`/jobs/${jobId}/roof-sketch`);
    await page.getByTestId("roof-plan").waitFor();

    // the Underlay panel: upload the plan there
    await page.getByRole("button", { name: "Underlay" }).click();
    await page.getByTestId("underlay-file").setInputFiles(PLAN_FILE);
    await page.getByTestId("underlay-image").waitFor();
    await expect.poll(() => page.getByTestId("underlay-panel").innerText()).toContain("800 × 600 px");
    await expect.poll(() => page.getByLabel("Plan file").locator("option:checked").innerText()).toContain("plan-20px-per-ft.png");
    await shot(page, "trace-plan", "01-plan-placed");

    // the scale: the rectangle's bottom corners are 20 ft apart
    await page.getByRole("button", { name: "Set scale from two points" }).click();
    const a = await pixelOnPage(page, CORNERS[0]!);
    const b = await pixelOnPage(page, CORNERS[1]!);
    await page.mouse.click(a.x, a.y);
    await page.mouse.click(b.x, b.y);
    await shot(page, "trace-plan", "02-scale-points");
    await page.getByLabel("Real distance between the points").fill("20'");
    await page.getByRole("button", { name: "Apply" }).click();
    // 800 px at 20 px per foot: the sheet is 40 ft wide
    await expect.poll(() => page.getByLabel("Plan width (feet)").inputValue()).toBe(`40' 0"`);
    await expect.poll(async () => (await pixelOnPage(page, CORNERS[0]!)).x).toBeCloseTo(a.x, 0); // the first point stayed
    await shot(page, "trace-plan", "03-scale-set");

    // trace: 1 in snap, the four corners, then the first one again to close
    await page.getByLabel("Snap to grid").selectOption({ label: "1 in" });
    await page.getByRole("button", { name: "Draw plane" }).click();
    const corners = [];
    for (const c of CORNERS) corners.push(await pixelOnPage(page, c));
    for (const c of corners) await page.mouse.click(c.x, c.y);
    await page.mouse.click(corners[0]!.x, corners[0]!.y);
    await expect.poll(() => page.getByRole("heading", { name: "Plane 1" }).count()).toBe(1);

    // 20 ft × 15 ft = 300 sq ft on the plan, within 2 % for the clicks' pixels
    await expect.poll(() => planArea(page), { timeout: 10_000 }).toBeGreaterThan(0);
    const area = await planArea(page);
    expect(Math.abs(area - 300) / 300).toBeLessThanOrEqual(0.02);
    await shot(page, "trace-plan", "04-traced");

    // saved with the roof, and back after a reload
    await page.getByRole("button", { name: "Save", exact: true }).click();
    await expect.poll(() => page.getByText("Roof saved.").count()).toBeGreaterThan(0);
    const saved = (await (await page.request.get(`/api/jobs/${jobId}/roof`)).json()) as {
      data: { planes: unknown[]; underlay?: { src: string; widthFt: number; page: number; visible: boolean } };
    };
    expect(saved.data.planes).toHaveLength(1);
    expect(saved.data.underlay).toMatchObject({ src: expect.stringMatching(/^\/api\/attachments\/\d+\/file(\?|$)/), page: 1, visible: true });
    expect(saved.data.underlay!.widthFt).toBeCloseTo(40, 0);

    await page.reload();
    await page.getByTestId("underlay-image").waitFor();
    await expect.poll(() => planArea(page)).toBeGreaterThan(0);
    expect(Math.abs((await planArea(page)) - 300) / 300).toBeLessThanOrEqual(0.02);
    // the reloaded plan lines up with the traced corner
    const plane = page.locator('path[data-hit="plane"]').first();
    const planeBox = (await plane.boundingBox())!;
    const cornerNow = await pixelOnPage(page, CORNERS[3]!); // top-left: the plane's box starts there
    expect(Math.abs(planeBox.x - cornerNow.x)).toBeLessThan(3);
    expect(Math.abs(planeBox.y - cornerNow.y)).toBeLessThan(3);
    await shot(page, "trace-plan", "05-after-reload");
    expect(failed).toEqual([]);
    await page.close();
  });

  it("places a page of a PDF plan: pdf.js renders the chosen page in the browser, the roof keeps the file and page", async () => {
    const page = await newPage(browser);
    const failed: string[] = [];
    page.on("pageerror", (e) => failed.push(String(e)));
    await signIn(page, "estimator@example.com");
    // a real PDF of several pages from the app itself: a demo job's install packet
    const list = (await (await page.request.get("/api/jobs?status=estimating,proposed")).json()) as { data: { id: number }[] };
    let jobId = 0;
    for (const j of list.data) {
      const roof = (await (await page.request.get(`/api/jobs/${j.id}/roof`)).json()) as { data: { planes: unknown[]; underlay?: unknown } };
      if (roof.data.planes.length > 0 && !roof.data.underlay) {
        jobId = j.id;
        break;
      }
    }
    expect(jobId).toBeGreaterThan(0);
    const pdf = await page.request.get(`/api/jobs/${jobId}/install-packet.pdf`);
    expect(pdf.headers()["content-type"]).toContain("application/pdf");
    const pdfFile = path.resolve("test-results/trace-plan/plan-set.pdf");
    writeFileSync(pdfFile, await pdf.body());

    await page.goto(`/jobs/${jobId}/roof-sketch`);
    await page.getByTestId("roof-plan").waitFor();
    await page.getByRole("button", { name: "Underlay" }).click();
    await page.getByTestId("underlay-file").setInputFiles(pdfFile);
    const image = page.getByTestId("underlay-image");
    // the page rendered to a PNG in memory (an image file would be shown from a blob: URL)
    await expect.poll(() => image.getAttribute("href"), { timeout: 30_000 }).toMatch(/^data:image\/png;base64,/);
    const first = await image.getAttribute("href");
    const panel = page.getByTestId("underlay-panel");
    await expect.poll(() => panel.innerText()).toMatch(/of \d+/);
    const pages = Number(/of (\d+)/.exec(await panel.innerText())![1]);
    expect(pages).toBeGreaterThanOrEqual(1);
    if (pages >= 2) {
      await page.getByLabel("PDF page").fill("2");
      await page.getByLabel("PDF page").press("Enter");
      await expect.poll(() => image.getAttribute("href"), { timeout: 30_000 }).not.toBe(first);
    }
    await shot(page, "trace-plan", "06-pdf-page");
    // the roof keeps the file's URL and the page, not the rendered picture
    await page.getByRole("button", { name: "Save", exact: true }).click();
    await expect.poll(() => page.getByText("Roof saved.").count()).toBeGreaterThan(0);
    const saved = (await (await page.request.get(`/api/jobs/${jobId}/roof`)).json()) as { data: { underlay?: { src: string; page: number } } };
    expect(saved.data.underlay).toMatchObject({ src: expect.stringMatching(/^\/api\/attachments\/\d+\/file(\?|$)/), page: pages >= 2 ? 2 : 1 });
    expect(failed).toEqual([]);
    await page.close();
  });
});
