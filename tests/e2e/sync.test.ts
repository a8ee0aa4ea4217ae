import Database from "better-sqlite3";
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";
import { describe, expect, inject, it } from "vitest";
import { makeJpeg } from "../support/jpeg";
import { LAPTOP, PHONE, shotPath, sharedBrowser } from "./support/browser";
import { deviceRecords, signInToField, tab, waitForSyncDone } from "./support/field";
import { DEMO, SignInPage } from "./support/pages";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

const server = () => new Database(inject("databaseUrl"), { readonly: true, fileMustExist: true });

async function logFind(page: Page, kind: string, weight: string) {
  await tab(page, "Today");
  await page.getByTestId("log-find").click();
  await page.getByRole("button", { name: kind, exact: true }).click();
  await page.getByLabel(/Weight \(g\)/).fill(weight);
  await page.getByRole("button", { name: "Save the find" }).click();
  await page.getByText("Find saved on this device.").waitFor();
  return new URL(page.url()).hash.match(/id=([^&]+)/)![1];
}

async function editNotes(page: Page, findId: string, notes: string) {
  await page.goto(`${baseUrl}/finds/view#id=${findId}`);
  await page.getByLabel("Notes").fill(notes);
  await page.getByRole("button", { name: "Save changes" }).click();
  await page.getByText("Saved on this device.").waitFor();
}

async function syncNow(page: Page) {
  await tab(page, "Sync");
  await page.getByRole("button", { name: "Sync now" }).click();
  await waitForSyncDone(page);
}

describe("camp sync between two devices of one member and the club", () => {
  it("brings offline work from both devices to the server once, converges, and the officer sees it", async () => {
    const phone = await (await browser().newContext({ ...PHONE, permissions: [] })).newPage();
    const tablet = await (await browser().newContext({ ...PHONE, permissions: [] })).newPage();
    await signInToField(phone, baseUrl);
    await signInToField(tablet, baseUrl);
    await waitForSyncDone(phone);
    await waitForSyncDone(tablet);
    const shared = (await deviceRecords(phone)).finds[0].id;

    await phone.context().setOffline(true);
    await tablet.context().setOffline(true);
    const fromPhone = await logFind(phone, "Nugget", "3.21");
    await phone
      .getByTestId("photo-input")
      .setInputFiles({ name: "p.jpg", mimeType: "image/jpeg", buffer: makeJpeg({ width: 1200, height: 900, lat: 41.8, lon: -117.62 }) });
    await phone.getByText(/Photo saved/).waitFor();
    await editNotes(phone, shared, "weighed again at camp (phone)");
    const fromTablet = await logFind(tablet, "Specimen", "54.3");
    await editNotes(tablet, shared, "cleaned with a brush (tablet)");

    // The phone reconnects; its first push is committed by the server but the answer is lost,
    // and its first photo upload is cut off.
    let droppedPush = 0;
    let cutUpload = 0;
    await phone.route("**/api/sync/push", async (route) => {
      if (droppedPush++ === 0) {
        await route.fetch(); // reaches the server, which commits
        return route.abort("connectionreset");
      }
      return route.continue();
    });
    await phone.route("**/api/photos/*/upload*", async (route) =>
      route.request().method() === "PUT" && cutUpload++ === 0 ? route.abort("connectionreset") : route.continue(),
    );
    await phone.context().setOffline(false);
    await tab(phone, "Sync");
    await phone.screenshot({ path: shotPath("sync-screen-phone"), fullPage: true });
    for (let i = 0; i < 4 && (await deviceRecords(phone)).outbox > 0; i++) {
      await phone
        .getByRole("button", { name: "Sync now" })
        .click()
        .catch(() => undefined);
      await phone.waitForTimeout(1500);
    }
    await syncNow(phone);
    expect(droppedPush).toBeGreaterThanOrEqual(2);
    expect(cutUpload).toBeGreaterThanOrEqual(2);

    // The tablet reconnects later: its edit of the shared find arrives last and stands.
    await tablet.context().setOffline(false);
    await syncNow(tablet);
    await syncNow(phone);
    await tab(phone, "Sync");
    await phone.screenshot({ path: shotPath("sync-screen-done-phone"), fullPage: true });

    const db = server();
    try {
      const a = await deviceRecords(phone);
      const b = await deviceRecords(tablet);
      const onServer = db
        .prepare("select id, notes, weight_grams as weightGrams, kind from finds where member_id = ? and deleted_at is null")
        .all(a.memberId) as typeof a.finds;
      const byId = (list: typeof a.finds) => Object.fromEntries(list.map((f) => [f.id, f]));
      expect(byId(a.finds)).toEqual(byId(onServer));
      expect(byId(b.finds)).toEqual(byId(onServer));
      expect(a.outbox).toBe(0);
      expect(b.outbox).toBe(0);
      // Nothing doubled, nothing lost; the later arrival won and the earlier version is in history.
      expect(db.prepare("select count(*) n from finds where id in (?, ?)").get(fromPhone, fromTablet)).toEqual({ n: 2 });
      expect(byId(onServer)[shared].notes).toBe("cleaned with a brush (tablet)");
      const history = db.prepare("select version from record_history where entity_id = ?").all(shared) as { version: string }[];
      expect(history.some((h) => JSON.parse(h.version).notes === "weighed again at camp (phone)")).toBe(true);
      // The photo on the server has the device's SHA-256.
      const photo = a.photos.find((p) => p.uploaded === 1)!;
      const row = db.prepare("select sha256, storage_key from photos where id = ?").get(photo.id) as { sha256: string; storage_key: string };
      const bytes = fs.readFileSync(path.join(inject("photoDir"), row.storage_key));
      expect(crypto.createHash("sha256").update(bytes).digest("hex")).toBe(photo.sha256);
      expect(row.sha256).toBe(photo.sha256);
      expect(fs.readdirSync(path.join(inject("photoDir"), "p")).filter((f) => f.endsWith(".part"))).toEqual([]);
    } finally {
      db.close();
    }

    // The officer sees the new finds in the club's season.
    const officer = await (await browser().newContext(LAPTOP)).newPage();
    const signIn = new SignInPage(officer, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    // Officers land on the console.
    await officer.getByRole("heading", { name: /Club console/ }).waitFor();
    const total = Number(await officer.getByTestId("club-total-finds").textContent());
    const db2 = server();
    const seasonStart = Date.UTC(new Date().getUTCFullYear(), 0, 1);
    expect(total).toBe((db2.prepare("select count(*) n from finds where deleted_at is null and found_at >= ?").get(seasonStart) as { n: number }).n);
    db2.close();
    await Promise.all([phone.context().close(), tablet.context().close(), officer.context().close()]);
  });
});

describe("two tabs of one member (RELIABILITY 9)", () => {
  it("both tabs' changes reach the server once; one tab leads the sync", async () => {
    const context = await browser().newContext({ ...PHONE, permissions: [] });
    const first = await context.newPage();
    await signInToField(first, baseUrl);
    await waitForSyncDone(first);
    const second = await context.newPage();
    await second.goto(`${baseUrl}/`);
    await second.getByRole("heading", { name: /Good day/ }).waitFor();
    await context.setOffline(true);
    const a = await logFind(first, "Fines", "0.42");
    const b = await logFind(second, "Crystalline", "1.7");
    await context.setOffline(false);
    await Promise.all([
      syncNow(first),
      second
        .getByRole("navigation", { name: "Field" })
        .getByRole("link", { name: "Sync", exact: true })
        .click()
        .then(() => second.getByRole("button", { name: "Sync now" }).click()),
    ]);
    await expect.poll(async () => (await deviceRecords(first)).outbox, { timeout: 30_000 }).toBe(0);
    const db = server();
    expect(db.prepare("select count(*) n from finds where id in (?, ?)").get(a, b)).toEqual({ n: 2 });
    db.close();

    // The tab that does not lead shows the leader's sync and how it ended (its own status
    // would stay as it was). The first tab's pull is held back, so it keeps the lock.
    await waitForSyncDone(second);
    let release = () => {};
    const holding = new Promise<void>((r) => (release = r));
    await first.route("**/api/sync/pull*", async (route) => {
      await holding;
      await route.continue();
    });
    await first.getByRole("button", { name: "Sync now" }).click();
    const status = (page: Page, kind: string) => page.locator(`[data-testid="sync-status"][data-kind="${kind}"]`).first();
    await status(first, "syncing").waitFor();
    await status(second, "syncing").waitFor({ timeout: 10_000 });
    release();
    await status(first, "done").waitFor({ timeout: 30_000 });
    await status(second, "done").waitFor({ timeout: 10_000 });
    await context.close();
  });
});
