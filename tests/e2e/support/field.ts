import fs from "node:fs";
import type { BrowserContext, Page } from "playwright-core";
import { DEMO, SignInPage } from "./pages";

/** Signs in through the form and waits until the member shell is up and the worker controls the page. */
export async function signInToField(page: Page, baseUrl: string, who = DEMO.member) {
  const signIn = new SignInPage(page, baseUrl);
  await signIn.open();
  await signIn.signIn(who.email, who.password);
  await page.getByRole("heading", { name: `Good day, ${who.firstName}` }).waitFor();
  await page.waitForFunction(
    async () => {
      const reg = await navigator.serviceWorker.ready;
      return reg.active?.state === "activated" && navigator.serviceWorker.controller !== null;
    },
    undefined,
    { timeout: 60_000 },
  );
}

export async function waitForSyncDone(page: Page) {
  await page.locator('[data-testid="sync-status"][data-kind="done"]').first().waitFor({ timeout: 30_000 });
}

/** Adds a scale on the Scales screen, as a member types it; answers its card once drawn. */
export async function addScale(page: Page, baseUrl: string, name: string, step: string) {
  await page.goto(`${baseUrl}/scales`);
  const add = page.getByRole("form", { name: "Add a scale" });
  await add.getByLabel("Name").fill(name);
  await add.getByLabel("Step (g)").fill(step);
  await add.getByRole("button", { name: "Add the scale" }).click();
  const card = page.getByRole("listitem", { name });
  await card.waitFor();
  return card;
}

/** Goes to a member screen through the tab bar (a client-side move, as a member's thumb would). */
export async function tab(page: Page, name: "Today" | "Finds" | "Outings" | "Map" | "Sync") {
  await page.getByRole("navigation", { name: "Field" }).getByRole("link", { name, exact: true }).click();
}

/**
 * Waits until the screen is drawn from the device. A member screen's head comes in the HTML,
 * so a heading alone says nothing: no "Loading" placeholder left in it does (the member known,
 * the screen's reads answered).
 */
export async function screenDrawn(page: Page) {
  await page.locator("main h1").first().waitFor();
  await page.waitForFunction(() => document.querySelector('main [role="status"][aria-label="Loading"]') === null, undefined, { timeout: 30_000 });
}

/**
 * The axe-core rules Lighthouse 12's accessibility category runs (its default config, the
 * version the bench pins), scored or not: the member and console screens keep that category
 * at 100, and a failure of any of them there is a failure here, whatever axe's impact label.
 */
async function lighthouseAxeRules(): Promise<string[]> {
  const { default: config } = await import("lighthouse/core/config/default-config.js");
  return (config.categories?.accessibility.auditRefs ?? []).map((ref) => ref.id);
}

// Read once per test file: a check runs on every screen at two sizes.
let axeSetup: Promise<{ wanted: string[]; source: string }> | undefined;

/** Runs axe-core in the page with Lighthouse's accessibility rules; returns every violation, as "rule: where". */
export async function axeViolations(page: Page) {
  axeSetup ??= lighthouseAxeRules().then((wanted) => ({ wanted, source: fs.readFileSync("node_modules/axe-core/axe.min.js", "utf8") }));
  const { wanted, source } = await axeSetup;
  await page.addScriptTag({ content: source });
  return page.evaluate(async (wanted) => {
    type Axe = {
      getRules: () => { ruleId: string }[];
      run: (ctx: unknown, opts: unknown) => Promise<{ violations: { id: string; nodes: { target: string[] }[] }[] }>;
    };
    const axe = (window as unknown as { axe: Axe }).axe;
    const known = new Set(axe.getRules().map((r) => r.ruleId));
    // A few of Lighthouse's audits are manual checks with no axe rule of their own (logical tab order, focus traps).
    const rules = wanted.filter((id) => known.has(id));
    const result = await axe.run(document, { runOnly: { type: "rule", values: rules } });
    return result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  }, wanted);
}

export async function firstPage(context: BrowserContext) {
  return context.pages()[0] ?? (await context.newPage());
}

export type DeviceFind = { id: string; notes: string; weightGrams: number | null; kind: string };

/** What a device's own database holds (read straight from IndexedDB, not through the UI). */
export async function deviceRecords(
  page: Page,
): Promise<{ memberId: string; finds: DeviceFind[]; photos: { id: string; sha256: string; uploaded: number }[]; outbox: number }> {
  return page.evaluate(async () => {
    const member = JSON.parse(localStorage.getItem("lodebook-member") ?? "null") as { id: string };
    const db = await new Promise<IDBDatabase>((resolve, reject) => {
      const r = indexedDB.open(`lodebook-member-${member.id}`);
      r.onsuccess = () => resolve(r.result);
      r.onerror = () => reject(r.error);
    });
    const all = <T>(store: string) =>
      new Promise<T[]>((resolve) => {
        const q = db.transaction(store).objectStore(store).getAll();
        q.onsuccess = () => resolve(q.result as T[]);
      });
    const finds = (await all<DeviceFind>("finds")).map((f) => ({ id: f.id, notes: f.notes, weightGrams: f.weightGrams, kind: f.kind }));
    const photos = (await all<{ id: string; sha256: string; uploaded: number }>("photos")).map((p) => ({ id: p.id, sha256: p.sha256, uploaded: p.uploaded }));
    const outbox = (await all("outbox")).length;
    db.close();
    return { memberId: member.id, finds, photos, outbox };
  });
}
