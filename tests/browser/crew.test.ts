/**
 * The crew's view on a phone: only the jobs they are assigned to, each opening, and the job's Files
 * section with the photo upload at 390 px wide.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, newPage, shot, signIn } from "./browser";

const JOURNEY = "crew";
const PHONE = { width: 390, height: 844 };

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The board's total from its pager ("1–4 of 4 jobs"). */
async function boardTotal(page: Page): Promise<number> {
  const pager = page.getByRole("navigation", { name: "Pages" }).getByText(/ of \d+ jobs?$/);
  await pager.waitFor();
  return Number(/ of (\d+) jobs?$/.exec((await pager.innerText()).trim())![1]);
}

/** The customer names on the board's current page, from each row's link. */
async function boardCustomers(page: Page): Promise<string[]> {
  const table = page.getByRole("table", { name: "Jobs" });
  await table.getByRole("row").nth(1).waitFor();
  return (await table.getByRole("link").allInnerTexts()).map((t) => t.trim());
}

describe("the crew on site", () => {
  it("sees only their assigned jobs, each opens, and the Files section takes photos on a phone", async () => {
    const owner = await newPage(browser);
    await signIn(owner, "owner@example.com");
    const ownerTotal = await boardTotal(owner);
    await owner.context().close();

    const page = await newPage(browser, PHONE);
    await signIn(page, "crew@example.com");
    await page.getByRole("heading", { level: 1, name: "Jobs" }).waitFor();
    await page.getByText("The jobs you're assigned to.").waitFor();
    const crewTotal = await boardTotal(page);
    expect(crewTotal).toBeGreaterThan(0);
    expect(crewTotal).toBeLessThan(ownerTotal);
    const customers = await boardCustomers(page);
    expect(customers).toHaveLength(crewTotal);
    // the crew never see prices: no quote column
    expect(await page.getByRole("table", { name: "Jobs" }).getByRole("columnheader", { name: /Quote/ }).count()).toBe(0);
    await shot(page, JOURNEY, "01-board");

    // every row opens its job
    for (const name of customers) {
      await page.getByRole("table", { name: "Jobs" }).getByRole("link", { name, exact: true }).click();
      await page.waitForURL(/\/jobs\/\d+\/site$/);
      await page.getByRole("heading", { level: 1, name }).waitFor();
      const tabs = page.getByRole("navigation", { name: "Job sections" });
      await expect
        .poll(async () => (await tabs.getByRole("link").allInnerTexts()).map((t) => t.trim()))
        .toEqual(["Site", "Roof sketch", "Takeoff", "Files"]);
      await page.goBack();
      await page.waitForURL(/\/jobs(\?.*)?$/);
      await page.getByRole("table", { name: "Jobs" }).getByRole("link", { name, exact: true }).waitFor();
    }

    // one job's Files section on the phone: photos first, the camera button up front
    const name = customers[0]!;
    await page.getByRole("table", { name: "Jobs" }).getByRole("link", { name, exact: true }).click();
    await page.waitForURL(/\/jobs\/\d+\/site$/);
    await page.getByRole("navigation", { name: "Job sections" }).getByRole("link", { name: "Files" }).click();
    await page.waitForURL(/\/jobs\/\d+\/files$/);
    await page.getByText("Add site photos").waitFor();
    // (the hidden file inputs behind these buttons carry the same names; the buttons are the ones with text)
    const camera = page.getByRole("button", { name: "Take a photo" }).filter({ hasText: "Take a photo" });
    const choose = page.getByRole("button", { name: "Choose photos" }).filter({ hasText: "Choose photos" });
    await camera.waitFor();
    await choose.waitFor();
    for (const button of [camera, choose]) {
      const box = (await button.boundingBox())!;
      // fully on the phone's screen, wide enough for a thumb
      expect(box.x).toBeGreaterThanOrEqual(0);
      expect(box.x + box.width).toBeLessThanOrEqual(PHONE.width);
      expect(box.height).toBeGreaterThanOrEqual(40);
    }
    // no sideways scrolling on the phone
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    await shot(page, JOURNEY, "02-files-on-phone");
    await page.context().close();
  });
});
