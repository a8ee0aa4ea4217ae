import fs from "node:fs";
import type { BrowserContext, Page } from "playwright-core";
import { DEMO, SignInPage } from "./pages";

/** Signs in through the form and waits until the member shell is up and the worker controls the page. */
export async function signInToField(page: Page, baseUrl: string, who = DEMO.member) {
  const signIn = new SignInPage(page, baseUrl);
  await signIn.open();
  await signIn.signIn(who.email, who.password);
  await page.getByRole("heading", { name: `Good day, ${who.firstName}` }).waitFor();
  await page.waitForFunction(async () => {
    const reg = await navigator.serviceWorker.ready;
    return reg.active?.state === "activated" && navigator.serviceWorker.controller !== null;
  }, undefined, { timeout: 60_000 });
}

export async function waitForSyncDone(page: Page) {
  await page.locator('[data-testid="sync-status"][data-kind="done"]').first().waitFor({ timeout: 30_000 });
}

/** Goes to a member screen through the tab bar (a client-side move, as a member's thumb would). */
export async function tab(page: Page, name: "Today" | "Finds" | "Outings" | "Map" | "Sync") {
  await page.getByRole("navigation", { name: "Field" }).getByRole("link", { name, exact: true }).click();
}

/** Runs axe-core in the page; returns the serious and critical violations. */
export async function axeViolations(page: Page) {
  await page.addScriptTag({ content: fs.readFileSync("node_modules/axe-core/axe.min.js", "utf8") });
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: unknown, opts: unknown) => Promise<{ violations: { id: string; impact: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: "tag", values: ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"] } });
    return result.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  });
}

export async function firstPage(context: BrowserContext) {
  return context.pages()[0] ?? (await context.newPage());
}
