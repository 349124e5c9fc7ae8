/** Debian's Chromium for the browser tests: installed with apt-get when missing (never a browser download). */
import { existsSync } from "node:fs";
import { spawnSync } from "node:child_process";

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

export function ensureChromium(log: (m: string) => void = console.log): string {
  if (existsSync(CHROMIUM_PATH)) return CHROMIUM_PATH;
  if (process.getuid?.() !== 0) {
    throw new Error(`Chromium is not installed at ${CHROMIUM_PATH}; install it with: sudo apt-get install -y chromium`);
  }
  log("Chromium not found: installing Debian's chromium package for the browser tests…");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  for (const args of [["update"], ["install", "-y", "--no-install-recommends", "chromium"]]) {
    const r = spawnSync("apt-get", args, { stdio: ["ignore", "inherit", "inherit"], env });
    if (r.status !== 0) throw new Error(`apt-get ${args.join(" ")} failed with exit code ${r.status}`);
  }
  return CHROMIUM_PATH;
}

/** Flags for a closed network: no background connections, no sandbox as root. */
export const CHROMIUM_ARGS = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-dev-shm-usage",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--no-first-run",
  "--disable-quic",
];
