import { mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { inject } from "vitest";
import { CHROMIUM_ARGS, CHROMIUM_PATH } from "../../scripts/lib/chromium";

export const DEMO_PASSWORD = "ridgewright-demo";
export const SCREENSHOT_DIR = "test-results/screenshots";

export const baseUrl = () => inject("baseUrl");

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
}

export async function newPage(browser: Browser, viewport = { width: 1280, height: 860 }): Promise<Page> {
  const context = await browser.newContext({ viewport, baseURL: baseUrl() });
  const page = await context.newPage();
  page.setDefaultTimeout(15_000);
  return page;
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/jobs/);
}

/** Saves a full-page screenshot of the step under test-results/screenshots/<journey>/<nn-step>.png. */
export async function shot(page: Page, journey: string, step: string) {
  const dir = path.join(SCREENSHOT_DIR, journey);
  mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${step}.png`), fullPage: true });
}
