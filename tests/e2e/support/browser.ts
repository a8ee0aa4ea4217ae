import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions } from "playwright-core";
import { afterAll, beforeAll } from "vitest";

export const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

// Flags that keep Debian's Chromium quiet on a machine with no outside network.
const ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM, args: ARGS });
}

/** A persistent context (its own profile folder), for tests that restart the browser. */
export async function launchPersistent(
  userDataDir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-profile-")),
  options: BrowserContextOptions = {},
): Promise<{ context: BrowserContext; userDataDir: string }> {
  const context = await chromium.launchPersistentContext(userDataDir, { executablePath: CHROMIUM, args: ARGS, ...options });
  return { context, userDataDir };
}

export const PHONE: BrowserContextOptions = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true };
export const LAPTOP: BrowserContextOptions = { viewport: { width: 1366, height: 860 } };

export const SHOTS_DIR = path.resolve("test-results/screenshots");
export function shotPath(name: string): string {
  fs.mkdirSync(SHOTS_DIR, { recursive: true });
  return path.join(SHOTS_DIR, `${name}.png`);
}

/** One Chromium for a test file: launched before its tests, closed after them. */
export function sharedBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => browser!;
}
