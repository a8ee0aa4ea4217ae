import Database from "better-sqlite3";
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import jpeg from "jpeg-js";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { paintSpecimenPhoto } from "../../bench/specimen-photo";
import { startShapedLink, type ShapedLink } from "../support/shaped-link";
import { PHONE, shotPath, sharedBrowser } from "./support/browser";
import { deviceRecords, signInToField, tab, waitForSyncDone } from "./support/field";

// Camp sync over a poor link (issue 17): a photo upload cut by the link resumes from the
// server's offset, and "records now, photos later" holds photos back until they are sent.

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();
const server = () => new Database(inject("databaseUrl"), { readonly: true, fileMustExist: true });
const TOBIAS = { email: "tobias@quillmarsh.example", password: "member-demo-pass", firstName: "Tobias" };
const RUTH = { email: "ruth@quillmarsh.example", password: "member-demo-pass", firstName: "Ruth" };

/** A camera JPEG of a painted specimen: after the device's shrinking, still a couple of hundred kB. */
const specimenJpeg = (seed: number) =>
  Buffer.from(jpeg.encode({ data: Buffer.from(paintSpecimenPhoto(2400, 1800, seed).buffer), width: 2400, height: 1800 }, 92).data);

async function findWithPhoto(page: Page, seed: number): Promise<{ photoId: string; bytes: number }> {
  await tab(page, "Today");
  await page.getByTestId("log-find").click();
  await page.getByRole("button", { name: "Specimen", exact: true }).click();
  await page.getByLabel(/Weight \(g\)/).fill("41.2");
  await page.getByRole("button", { name: "Save the find" }).click();
  await page.getByText("Find saved on this device.").waitFor();
  const findId = new URL(page.url()).hash.match(/id=([^&]+)/)![1];
  await page.getByTestId("photo-input").setInputFiles({ name: "specimen.jpg", mimeType: "image/jpeg", buffer: specimenJpeg(seed) });
  await page.getByText(/Photo saved/).waitFor();
  return page.evaluate(async (id) => {
    const member = JSON.parse(localStorage.getItem("lodebook-member")!) as { id: string };
    const db = await new Promise<IDBDatabase>((resolve) => {
      const r = indexedDB.open(`lodebook-member-${member.id}`);
      r.onsuccess = () => resolve(r.result);
    });
    const photos = await new Promise<{ id: string; findId: string; bytes: number }[]>((resolve) => {
      const q = db.transaction("photos").objectStore("photos").getAll();
      q.onsuccess = () => resolve(q.result);
    });
    db.close();
    const photo = photos.find((p) => p.findId === id)!;
    return { photoId: photo.id, bytes: photo.bytes };
  }, findId);
}

const storedBytes = (photoId: string) => {
  const db = server();
  try {
    const row = db.prepare("select storage_key as key, sha256 from photos where id = ?").get(photoId) as { key: string | null; sha256: string } | undefined;
    return row?.key ? { bytes: fs.readFileSync(path.join(inject("photoDir"), row.key)), sha256: row.sha256 } : null;
  } finally {
    db.close();
  }
};

describe("camp sync over a poor link", () => {
  let link: ShapedLink;
  beforeAll(async () => {
    link = await startShapedLink({ targetPort: Number(new URL(baseUrl).port), upBps: 1_000_000, downBps: 5_000_000, rttMs: 100 });
  });
  afterAll(() => link.close());

  it("a photo upload cut half-way finishes from the server's offset, and the server ends with the exact bytes", async () => {
    link.shaping = false;
    const via = `http://localhost:${link.port}`; // the app reached through the shaped link
    const page = await (await browser().newContext({ ...PHONE, permissions: [] })).newPage();
    await signInToField(page, baseUrl, TOBIAS);
    await waitForSyncDone(page);
    // The session cookie is the host's, so the same member opens the app through the link (its
    // own origin: its own device database and service worker). A navigation the first origin's
    // worker aborts (it reloads pages as it takes control) is made again.
    await page.goto(`${via}/`).catch(() => page.goto(`${via}/`));
    await page.getByRole("heading", { name: `Good day, ${TOBIAS.firstName}` }).waitFor();
    await page.waitForFunction(
      async () => (await navigator.serviceWorker.ready).active?.state === "activated" && navigator.serviceWorker.controller !== null,
      undefined,
      { timeout: 60_000 },
    );
    await waitForSyncDone(page);
    expect(link.bytes.up).toBeGreaterThan(0);
    await page.context().setOffline(true);
    const { photoId, bytes } = await findWithPhoto(page, 31);
    expect(bytes).toBeGreaterThan(100_000);

    // Back in signal over the slow link; the link drops when half the photo has gone up.
    const offsets: number[] = [];
    page.on("request", (r) => {
      const m = r.url().match(/\/api\/photos\/[^/]+\/upload\?offset=(\d+)/);
      if (m && r.method() === "PUT") offsets.push(Number(m[1]));
    });
    let cutAt = 0;
    link.shaping = true;
    link.onUpBytes(link.bytes.up + 12_000 + bytes / 2, () => {
      cutAt = link.bytes.up;
      link.cut(500);
    });
    await page.context().setOffline(false);
    await tab(page, "Sync");
    await page.getByTestId("photo-progress").waitFor({ timeout: 30_000 });
    await page.screenshot({ path: shotPath("poor-link-sync-progress"), fullPage: true });
    await expect.poll(() => storedBytes(photoId) !== null, { timeout: 60_000 }).toBe(true);
    await waitForSyncDone(page);
    const onServer = storedBytes(photoId);
    expect(cutAt).toBeGreaterThan(0);
    expect(onServer).not.toBeNull();
    expect(crypto.createHash("sha256").update(onServer!.bytes).digest("hex")).toBe(onServer!.sha256);
    expect((await deviceRecords(page)).photos.find((p) => p.id === photoId)).toMatchObject({ uploaded: 1, sha256: onServer!.sha256 });
    // The second request went on from where the first was cut, not from 0.
    expect(offsets[0]).toBe(0);
    expect(offsets.length).toBeGreaterThanOrEqual(2);
    expect(offsets.at(-1)!).toBeGreaterThan(0);
    // The server's partial is gone once the photo is stored.
    const partial = path.join(inject("photoDir"), ".partial");
    const left = fs.existsSync(partial) ? fs.readdirSync(partial, { recursive: true }).filter((f) => String(f).includes(photoId)) : [];
    expect(left).toEqual([]);
    await page.context().close();
  });

  it("records now, photos later: records go, photos wait until 'send photos now'", async () => {
    const page = await (await browser().newContext({ ...PHONE, permissions: [] })).newPage();
    await signInToField(page, baseUrl, RUTH);
    await waitForSyncDone(page);
    await tab(page, "Sync");
    await page.getByRole("checkbox", { name: /Records now, photos later/ }).check();
    await page.context().setOffline(true);
    const { photoId } = await findWithPhoto(page, 32);
    await page.context().setOffline(false);
    await tab(page, "Sync");
    await page.getByRole("button", { name: "Sync now" }).click();
    await expect.poll(async () => (await deviceRecords(page)).outbox, { timeout: 30_000 }).toBe(0);
    await waitForSyncDone(page);
    await page
      .getByTestId("photos-waiting")
      .filter({ hasText: /Photos waiting: 1 \(\d+ kB\)/ })
      .waitFor();
    await page.screenshot({ path: shotPath("poor-link-photos-later"), fullPage: true });
    const records = await deviceRecords(page);
    expect(records.outbox).toBe(0);
    expect(records.photos.find((p) => p.id === photoId)?.uploaded).toBe(0);
    const db = server();
    expect(db.prepare("select storage_key as key from photos where id = ?").get(photoId)).toEqual({ key: null });
    db.close();

    await page.getByRole("button", { name: "Send photos now" }).click();
    await page.getByTestId("photos-waiting").filter({ hasText: "No photos waiting." }).waitFor({ timeout: 30_000 });
    expect(storedBytes(photoId)).not.toBeNull();
    await page.getByRole("checkbox", { name: /Records now, photos later/ }).uncheck();
    await page.context().close();
  });
});
