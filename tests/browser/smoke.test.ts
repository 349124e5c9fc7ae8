import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser, newPage, shot, signIn } from "./browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("signing in as each demo role", () => {
  it.each([
    ["owner@example.com", ["Jobs", "Customers", "Approvals", "Price book", "Team", "Company"]],
    ["estimator@example.com", ["Jobs", "Customers", "Price book"]],
    ["crew@example.com", ["Jobs"]],
  ])("%s lands on the jobs board with the role's navigation", async (email, nav) => {
    const page = await newPage(browser);
    await signIn(page, email);
    const links = page.getByRole("navigation", { name: /main/i }).getByRole("link");
    await expect.poll(async () => (await links.allInnerTexts()).map((t) => t.trim())).toEqual(nav);
    await expect.poll(() => page.getByRole("table").count()).toBeGreaterThan(0);
    await shot(page, "sign-in", email.split("@")[0]);
    await page.close();
  });
});
