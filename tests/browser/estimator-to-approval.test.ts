/**
 * The estimator-to-approval journey against the real built client and server: a new job with a new
 * customer, a hip roof from a quick shape plus a lean-to wing drawn corner by corner on the plan, a layer
 * stack with a mesh mat and foil on the deck, the stored takeoff, a quote submitted for approval, the owner
 * returning it with a comment, the estimator revising it (a manual line for the disposal) and submitting it
 * again, and the owner approving the revised quote. Every step leaves a screenshot under
 * test-results/screenshots/estimator-to-approval/.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Locator, Page } from "playwright-core";
import { launchBrowser, newPage, shot, signIn } from "./browser";

const JOURNEY = "estimator-to-approval";
const CUSTOMER = "Imogen Farrowdale";
const CUSTOMER_EMAIL = "imogen.farrowdale@example.com";
const RETURN_COMMENT = "Tear-off disposal is not priced: add the dumpster and haul-away as a line, then send it back.";
const DISPOSAL_LINE = "Dumpster and haul-away, 20 yd";
const DISPOSAL_PRICE = 650; // dollars, not taxable: the total rises by exactly this much

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The text of the value (dd) beside a label (dt) in a definition list. */
const valueBeside = (list: Locator, label: string) =>
  list.locator("dt", { hasText: new RegExp(`^${label}$`) }).locator("xpath=following-sibling::dd[1]");

const numberIn = (text: string | null) => Number((text ?? "").replace(/[^0-9.]/g, ""));

const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/**
 * The drawing's feet → page px mapping, read off the plan as a person would: the hip roof was placed
 * from (0, 0) to (40, 28) ft, so its drawn outline gives the origin and the scale (y grows north on
 * the plan, down on the screen).
 */
async function planToPage(page: Page, hip: { widthFt: number; depthFt: number }) {
  const drawing = page.getByRole("application", { name: "Roof plan drawing" });
  const box = await drawing.evaluate((svg) => {
    const rects = [...svg.querySelectorAll('path[data-hit="plane"]')].map((p) => p.getBoundingClientRect());
    return {
      left: Math.min(...rects.map((r) => r.left)),
      right: Math.max(...rects.map((r) => r.right)),
      top: Math.min(...rects.map((r) => r.top)),
      bottom: Math.max(...rects.map((r) => r.bottom)),
    };
  });
  const scale = (box.right - box.left) / hip.widthFt;
  // the outline's height must agree with its width: the plan is drawn to one scale
  expect((box.bottom - box.top) / hip.depthFt).toBeCloseTo(scale, 0);
  return { scale, at: (x: number, y: number) => ({ x: box.left + x * scale, y: box.bottom - y * scale }) };
}

describe("an estimator prices a job, the owner returns it, and approves the revision", () => {
  it("goes from a new job to a returned, revised and approved quote", async () => {
    // ---- 1. the estimator creates a job for a new customer ------------------------------------------
    const page = await newPage(browser);
    await signIn(page, "estimator@example.com");
    await page.getByRole("button", { name: "New job" }).first().click();
    const dialog = page.getByRole("dialog", { name: "New job" });
    await dialog.getByRole("button", { name: "New customer" }).click();
    const customer = dialog.getByRole("region", { name: "Customer" });
    await customer.getByLabel("Name").fill(CUSTOMER);
    await customer.getByLabel("E-mail").fill(CUSTOMER_EMAIL);
    await customer.getByLabel("Phone").fill("555-0142");
    await customer.getByLabel("Street address").fill("19 Larkspur Hollow");
    await customer.getByLabel("City").fill("Brackenfield");
    await customer.getByLabel("State").fill("OR");
    await customer.getByLabel("ZIP").fill("97000");
    const siteAddress = dialog.getByRole("region", { name: "Site address" });
    await siteAddress.getByLabel("Street address").fill("21 Larkspur Hollow");
    await siteAddress.getByLabel("City").fill("Brackenfield");
    await siteAddress.getByLabel("State").fill("OR");
    await siteAddress.getByLabel("ZIP").fill("97000");
    await dialog.getByLabel("Notes").fill("Vaulted living room under the main roof; the homeowner asked about a cooler roof.");
    await dialog.getByText("Site data for the takeoff").click();
    await dialog.getByLabel("Attic", { exact: true }).selectOption({ label: "Cathedral ceiling, no attic" });
    await dialog.getByLabel("Climate zone").fill("4C");
    await dialog.getByLabel("Basic wind speed (mph)").fill("110");
    await dialog.getByLabel("Exposure").selectOption({ label: "B (suburban, wooded)" });
    await dialog.getByLabel("Mean roof height (ft)").fill("14");
    await shot(page, JOURNEY, "01-new-job-dialog");
    await dialog.getByRole("button", { name: "Create job" }).click();

    await page.waitForURL(/\/jobs\/\d+\/site$/);
    const jobId = Number(/\/jobs\/(\d+)\//.exec(page.url())![1]);
    await page.getByRole("heading", { level: 1, name: CUSTOMER }).waitFor();
    const sections = page.getByRole("navigation", { name: "Job sections" });
    await expect
      .poll(async () => (await sections.getByRole("link").allInnerTexts()).map((t) => t.trim()))
      .toEqual(["Site", "Roof sketch", "Layer stack", "Gap study", "Takeoff", "Pricing", "Proposal", "Files", "Log"]);
    // the site data typed in the dialog was stored with the job
    await expect.poll(() => page.getByLabel("Attic", { exact: true }).inputValue()).toBe("cathedral");
    await shot(page, JOURNEY, "02-job-workspace");

    // ---- 2. roof sketch: a hip from the quick shape, a wing drawn corner by corner ------------------
    await sections.getByRole("link", { name: "Roof sketch" }).click();
    await page.waitForURL(new RegExp(`/jobs/${jobId}/roof-sketch$`));
    const tools = page.getByRole("toolbar", { name: "Sketch tools" });
    await tools.getByRole("button", { name: "Quick shape…" }).click();
    const quick = page.getByRole("dialog", { name: "Add a quick shape" });
    await quick.getByLabel("Shape").selectOption({ label: "Hip (4 planes)" });
    await quick.getByLabel("Pitch (rise in 12)").fill("6");
    await quick.getByLabel("Width, east–west (ft)").fill("40");
    await quick.getByLabel("Depth, north–south (ft)").fill("28");
    await quick.getByRole("button", { name: "Add planes" }).click();
    await quick.waitFor({ state: "detached" });

    const totals = page.getByLabel("Roof totals");
    const squares = valueBeside(totals, "Squares");
    const planArea = valueBeside(totals, "Plan area");
    await expect.poll(() => planArea.textContent()).toBe("1,120 sq ft"); // 40 × 28 ft
    const hipSquares = numberIn(await squares.textContent());
    expect(hipSquares).toBeGreaterThan(11.2); // sloped area is more than the plan area at 6/12
    await shot(page, JOURNEY, "03-hip-from-quick-shape");

    // Room south of the hip for the wing, then the drawing's scale read off the hip's outline.
    const zoomOut = page.getByRole("group", { name: "Zoom" }).getByRole("button", { name: "Zoom out" });
    for (let i = 0; i < 3; i++) await zoomOut.click();
    const drawing = page.getByRole("application", { name: "Roof plan drawing" });
    await drawing.scrollIntoViewIfNeeded();
    const plan = await planToPage(page, { widthFt: 40, depthFt: 28 });
    expect(plan.scale).toBeGreaterThan(4); // at least 4 px per foot: a 1 ft snap is easy to hit

    // A 16 × 12 ft lean-to along the south-east part of the main eave: an L-shaped roof.
    await tools.getByRole("button", { name: "Draw plane" }).click();
    const corners: [number, number][] = [
      [40, 0],
      [24, 0],
      [24, -12],
      [40, -12],
    ];
    for (const [x, y] of corners) {
      const p = plan.at(x, y);
      await page.mouse.click(p.x, p.y);
    }
    await page.getByText("4 corners").waitFor();
    await shot(page, JOURNEY, "04-wing-corners");
    const first = plan.at(...corners[0]!);
    await page.mouse.click(first.x, first.y); // back on the first corner closes the outline

    // The new plane is selected: name it, set its pitch, eave edge and eave height.
    const inspector = page.getByRole("region", { name: "Plane 5" }); // the hip's four planes, then this one
    await inspector.waitFor();
    await inspector.getByLabel("Name", { exact: true }).fill("Porch wing");
    await inspector.getByLabel("Name", { exact: true }).press("Enter");
    const wing = page.getByRole("region", { name: "Porch wing" });
    await wing.getByRole("heading", { name: "Porch wing" }).waitFor();
    // drawn from the main eave: the first edge is the top of the wing, the third its low edge
    await expect.poll(() => wing.getByLabel("Eave edge").inputValue()).toBe("0");
    await wing.getByLabel("Eave edge").selectOption({ label: `Edge 3 · 16' 0"` });
    await wing.getByLabel("Pitch (rise in 12)").fill("4");
    await wing.getByLabel("Pitch (rise in 12)").press("Enter");
    // its top (12 ft at 4/12 = 4 ft up) meets the main eave: its own eave sits 4 ft lower
    await wing.getByLabel("Eave height (ft)").fill("-4");
    await wing.getByLabel("Eave height (ft)").press("Enter");
    await expect.poll(() => wing.getByLabel("Pitch (rise in 12)").inputValue()).toBe("4");
    await wing.getByText("18.4° · 33.3% slope").waitFor();
    const edges = wing.getByRole("listitem");
    await expect.poll(() => edges.filter({ hasText: "(eave edge)" }).allInnerTexts()).toEqual([expect.stringMatching(/^Edge 3\s/)]);
    // the engine types the wing's edges: its top is a change of slope against the main roof
    await expect.poll(() => edges.filter({ hasText: /^Edge 1/ }).innerText()).toMatch(/Transition/i);

    await expect.poll(() => planArea.textContent()).toBe("1,312 sq ft"); // + 16 × 12 ft
    await expect.poll(async () => numberIn(await squares.textContent())).toBeGreaterThan(hipSquares + 1.92);
    await shot(page, JOURNEY, "05-wing-pitch-and-eave");

    await tools.getByRole("button", { name: "Save" }).click();
    await tools.getByText("Saved", { exact: true }).waitFor();
    const savedSquares = numberIn(await squares.textContent());
    expect(savedSquares).toBeGreaterThan(0);
    await shot(page, JOURNEY, "06-roof-saved");

    // ---- 3. layer stack: a 3D mesh mat with foil on the deck facing up ------------------------------
    await sections.getByRole("link", { name: "Layer stack" }).click();
    await page.waitForURL(new RegExp(`/jobs/${jobId}/layer-stack$`));
    const layers = page.getByRole("form", { name: /^Layers of / });
    await layers.getByRole("combobox", { name: "Spacer", exact: true }).selectOption({ label: "3D mesh mat" });
    await layers.getByRole("combobox", { name: "Radiant barrier", exact: true }).selectOption({ label: "Reflective foil" });
    await layers.getByRole("combobox", { name: "Laid" }).selectOption({ label: "On the deck" });
    await layers.getByRole("combobox", { name: "Reflective face" }).selectOption({ label: "Up" });

    const section = page.getByRole("img", { name: /^Cross-section of / });
    await expect.poll(() => section.getAttribute("aria-label")).toMatch(/3D mesh mat, gap 0\.3 in\..*The foil's reflective face faces the air gap\./);
    await page.getByText("Foil: reflective face → air gap.").waitFor();
    await section.getByText("Foil on the deck").waitFor();
    await section.getByText("reflective face up → air gap").waitFor();
    // a 0.3 in mat is a drainage plane, not a ventilation channel (under the 3/4 in minimum)
    await page.getByText(/Air path open from eave to ridge, but the channel is .* high \(under 3\/4 in\)/).waitFor();

    const spacerFindings = page.getByRole("list", { name: "Spacer findings" });
    await spacerFindings
      .getByRole("listitem")
      .filter({ hasText: /mesh mat leaves 0\.3\d? in: a thermal break and drainage plane, not a ventilation channel/ })
      .waitFor();
    expect(await spacerFindings.getByRole("listitem").first().innerText()).toMatch(/^(Warning|Error|Note)/);

    const roofDraft = page.getByRole("group", { name: "Roof draft" });
    await roofDraft.getByText("Unsaved changes").waitFor();
    await shot(page, JOURNEY, "07-layer-stack");
    await roofDraft.getByRole("button", { name: "Save roof" }).click();
    await roofDraft.getByText("Saved · version 2").waitFor();
    await shot(page, JOURNEY, "08-layer-stack-saved");

    // ---- 4. takeoff: the stored numbers of the saved roof ------------------------------------------
    await sections.getByRole("link", { name: "Takeoff" }).click();
    await page.waitForURL(new RegExp(`/jobs/${jobId}/takeoff$`));
    const materials = page.getByRole("table", { name: "Materials" });
    await materials.waitFor();
    await materials.getByRole("row", { name: /Standing-seam panels/ }).first().waitFor();
    await materials.getByRole("row", { name: /Synthetic underlayment/ }).first().waitFor();
    // the stack saved a moment ago is what the server worked out: the mat and the foil are ordered
    await materials.getByRole("row", { name: /3D drainage\/ventilation mesh mat/ }).first().waitFor();
    await materials.getByRole("row", { name: /Foil radiant barrier/ }).first().waitFor();
    await materials.getByRole("row", { name: /Transition \(change-of-slope\) flashing/ }).first().waitFor();
    await shot(page, JOURNEY, "09-takeoff");

    // ---- 5. pricing: a new quote, its options and totals, submitted -----------------------------
    await sections.getByRole("link", { name: "Pricing" }).click();
    await page.waitForURL(new RegExp(`/jobs/${jobId}/pricing`));
    await page.getByRole("button", { name: "New quote" }).click();
    const options = page.getByRole("table", { name: "Options compared" });
    await options.waitFor();
    const totalRow = options.getByRole("row", { name: /^Total\b/ });
    await expect.poll(() => totalRow.innerText()).toMatch(/\$\s?\d{1,3}(,\d{3})+(\.\d{2})?/);
    const total = numberIn(/\$[\d,.]+/.exec(await totalRow.innerText())![0]);
    expect(total).toBeGreaterThan(1000);
    const quoteTabs = page.getByRole("navigation", { name: "Quotes of this job" });
    const quoteNumber = (await quoteTabs.getByRole("button").first().innerText()).split(/\s/)[0]!;
    expect(quoteNumber).toMatch(/\w/);
    await shot(page, JOURNEY, "10-quote");

    await page.getByRole("button", { name: "Submit for approval" }).click();
    await page.getByText("Waiting for the owner's review").waitFor();
    await quoteTabs.getByText("In review").waitFor();
    await shot(page, JOURNEY, "11-submitted");
    await page.context().close();

    // ---- 6. the owner returns it to the estimator with a comment -----------------------------------
    const owner = await newPage(browser);
    await signIn(owner, "owner@example.com");
    const ownerNav = owner.getByRole("navigation", { name: /main/i });
    await ownerNav.getByRole("link", { name: "Approvals" }).click();
    const queue = owner.getByRole("table", { name: "Quotes waiting for approval" });
    const row = queue.getByRole("row").filter({ hasText: CUSTOMER });
    await row.waitFor();
    await row.getByRole("link", { name: quoteNumber }).click();
    await owner.waitForURL(/\/approvals\/\d+$/);
    await owner.getByRole("heading", { level: 1, name: new RegExp(`Review ${quoteNumber}`) }).waitFor();
    await owner.getByText(`${CUSTOMER} · 21 Larkspur Hollow, Brackenfield ·`).waitFor();
    // the figures the estimator submitted
    await expect
      .poll(async () => numberIn(/\$[\d,.]+/.exec(await owner.getByRole("table", { name: "Options compared" }).getByRole("row", { name: /^Total\b/ }).innerText())?.[0] ?? null))
      .toBeCloseTo(total, 2);
    const returnForm = owner.getByRole("form", { name: "Return to the estimator" });
    await returnForm.getByLabel("What should change? (required)").fill(RETURN_COMMENT);
    await shot(owner, JOURNEY, "12-return-comment");
    await returnForm.getByRole("button", { name: "Return with comment" }).click();
    await owner.waitForURL(/\/approvals$/);
    await owner.getByText(`${quoteNumber} returned to the estimator.`).waitFor();
    // back with the estimator: the queue no longer lists it
    await expect.poll(() => owner.getByRole("row").filter({ hasText: CUSTOMER }).count()).toBe(0);
    await shot(owner, JOURNEY, "13-returned");
    await owner.context().close();

    // ---- 7. the estimator reads the comment, adds the disposal line and submits again --------------
    const estimator = await newPage(browser);
    await signIn(estimator, "estimator@example.com");
    await estimator.getByRole("navigation", { name: /main/i }).getByRole("link", { name: "Jobs" }).click();
    await estimator.getByRole("searchbox", { name: "Search jobs" }).fill(CUSTOMER);
    await estimator.getByRole("table", { name: "Jobs" }).getByRole("link", { name: CUSTOMER }).click();
    await estimator.waitForURL(new RegExp(`/jobs/${jobId}/site$`));
    await estimator.getByRole("navigation", { name: "Job sections" }).getByRole("link", { name: "Pricing" }).click();
    await estimator.waitForURL(new RegExp(`/jobs/${jobId}/pricing`));
    const estQuoteTabs = estimator.getByRole("navigation", { name: "Quotes of this job" });
    const estQuoteTab = estQuoteTabs.getByRole("button", { name: new RegExp(`^${escapeRegExp(quoteNumber)}\\b`) });
    await estQuoteTab.getByText("Draft", { exact: true }).waitFor();
    // the owner's comment, word for word, above the draft
    const returned = estimator.getByRole("status").filter({ hasText: /^Returned by / });
    await returned.waitFor();
    await expect.poll(() => returned.innerText()).toContain(`“${RETURN_COMMENT}”`);
    await estimator.getByText(`“${RETURN_COMMENT}”`).waitFor();
    const draft = estimator.getByRole("form", { name: "Edit draft" });
    await draft.waitFor();
    await shot(estimator, JOURNEY, "14-returned-draft");

    const manual = draft.getByRole("region", { name: "Manual lines" });
    await manual.getByRole("button", { name: "Add manual line" }).click();
    await manual.getByLabel("Description").fill(DISPOSAL_LINE);
    await manual.getByLabel("Qty").fill("1");
    await manual.getByLabel("Unit price ($)").fill(String(DISPOSAL_PRICE));
    await manual.getByLabel("Unit cost ($)").fill("480");
    await expect.poll(() => manual.getByLabel("Taxable").isChecked()).toBe(false);
    await draft.getByText("Unsaved changes: the figures above update when you save.").waitFor();
    // nothing goes to the owner while the edit is unsaved
    expect(await estimator.getByRole("button", { name: "Submit for approval" }).isDisabled()).toBe(true);
    await shot(estimator, JOURNEY, "15-revision-typed");
    await draft.getByRole("button", { name: "Save draft" }).click();
    await estimator.getByText("Draft saved and re-priced.").waitFor();

    const estOptions = estimator.getByRole("table", { name: "Options compared" });
    const estTotalRow = estOptions.getByRole("row", { name: /^Total\b/ });
    // the disposal line is sold at its own price and not taxed: the total rises by exactly that
    await expect
      .poll(async () => numberIn(/\$[\d,.]+/.exec(await estTotalRow.innerText())?.[0] ?? null))
      .toBeCloseTo(total + DISPOSAL_PRICE, 2);
    const revisedTotal = numberIn(/\$[\d,.]+/.exec(await estTotalRow.innerText())![0]);
    await estOptions.getByRole("row", { name: /^Manual lines cost\b/ }).getByText("$480.00").waitFor();
    await estimator.getByText("Unsaved changes: the figures above update when you save.").waitFor({ state: "detached" });
    await shot(estimator, JOURNEY, "16-revision-saved");

    await estimator.getByRole("button", { name: "Submit for approval" }).click();
    await estimator.getByText("Waiting for the owner's review").waitFor();
    await estQuoteTab.getByText("In review", { exact: true }).waitFor();
    await shot(estimator, JOURNEY, "17-resubmitted");
    await estimator.context().close();

    // ---- 8. the owner approves the revised quote ---------------------------------------------------
    const approver = await newPage(browser);
    await signIn(approver, "owner@example.com");
    await approver.getByRole("navigation", { name: /main/i }).getByRole("link", { name: "Approvals" }).click();
    const queueAgain = approver.getByRole("table", { name: "Quotes waiting for approval" });
    const rowAgain = queueAgain.getByRole("row").filter({ hasText: CUSTOMER });
    await rowAgain.waitFor();
    await shot(approver, JOURNEY, "18-approvals-queue");
    await rowAgain.getByRole("link", { name: quoteNumber }).click();
    await approver.waitForURL(/\/approvals\/\d+$/);
    await approver.getByRole("heading", { level: 1, name: new RegExp(`Review ${quoteNumber}`) }).waitFor();
    await approver.getByText(`${CUSTOMER} · 21 Larkspur Hollow, Brackenfield ·`).waitFor();
    // the review shows the revised figures: the new total and the disposal line
    const reviewTotal = approver.getByRole("table", { name: "Options compared" }).getByRole("row", { name: /^Total\b/ });
    await expect.poll(async () => numberIn(/\$[\d,.]+/.exec(await reviewTotal.innerText())?.[0] ?? null)).toBeCloseTo(revisedTotal, 2);
    await approver.locator("summary", { hasText: /^\W*Option A · / }).click(); // unfold the option's line items
    await approver
      .getByRole("table", { name: "Lines of option A" })
      .getByRole("row", { name: new RegExp(DISPOSAL_LINE) })
      .getByText("$650.00")
      .waitFor();

    const approveForm = approver.getByRole("form", { name: "Approve" });
    const required = approveForm.getByLabel("Reason for approving (required)");
    if (await required.count()) {
      await required.fill("Mesh and foil option reviewed with the homeowner; margin accepted for this job.");
    }
    await shot(approver, JOURNEY, "19-review");
    await approveForm.getByRole("button", { name: `Approve ${quoteNumber}` }).click();
    await approver.waitForURL(/\/approvals$/);
    await approver.getByText(`${quoteNumber} approved.`).waitFor();
    await expect.poll(() => approver.getByRole("row").filter({ hasText: CUSTOMER }).count()).toBe(0);

    // the job's Pricing section shows the quote approved
    await approver.getByRole("navigation", { name: /main/i }).getByRole("link", { name: "Jobs" }).click();
    await approver.getByRole("searchbox", { name: "Search jobs" }).fill(CUSTOMER);
    await approver.getByRole("table", { name: "Jobs" }).getByRole("link", { name: CUSTOMER }).click();
    await approver.waitForURL(new RegExp(`/jobs/${jobId}/site$`));
    await approver.getByRole("navigation", { name: "Job sections" }).getByRole("link", { name: "Pricing" }).click();
    await approver.getByText(/^Approved by .+ on /).waitFor();
    await approver.getByRole("navigation", { name: "Quotes of this job" }).getByText("Approved").waitFor();
    await shot(approver, JOURNEY, "20-approved");
    await approver.context().close();
  });
});
