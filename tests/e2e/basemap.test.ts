import fs from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { afterAll, describe, expect, inject, it } from "vitest";
import { makeDemoBasemap } from "@/server/seed/demo-basemap";
import { launchPersistent, LAPTOP, PHONE, shotPath } from "./support/browser";
import { firstPage, signInToField, waitForSyncDone } from "./support/field";
import { DEMO, SignInPage } from "./support/pages";
import { DEMO_CLAIMS } from "@/server/seed/people";

const baseUrl = inject("baseUrl");
const dirs: string[] = [];
afterAll(() => dirs.forEach((d) => fs.rmSync(d, { recursive: true, force: true })));

/** The map, once its basemap of the given kind has drawn tiles. */
async function mapWithBasemap(page: import("playwright-core").Page, kind: "offline" | "online") {
  const map = page.locator(`[data-testid=map][data-map-ready][data-basemap="${kind}"]`);
  await map.waitFor({ timeout: 30_000 });
  expect(Number(await map.getAttribute("data-basemap-tiles"))).toBeGreaterThan(0);
  return map;
}

describe("the club's basemap on the phone (issue 19)", () => {
  it("a member keeps the basemap on the phone, and the map draws the ground with no signal", async () => {
    const { context, userDataDir } = await launchPersistent(undefined, PHONE);
    dirs.push(userDataDir);
    const page = await firstPage(context);
    await signInToField(page, baseUrl);
    await waitForSyncDone(page);

    // With signal and nothing kept: the map reads the club's server.
    await page.goto(`${baseUrl}/map`);
    const online = await mapWithBasemap(page, "online");

    // The map is made once: the member pans it, a position fix comes, and the same map (same
    // canvas) shows the fix where the member left it, not rebuilt and fitted afresh.
    const canvas = online.locator("canvas");
    await canvas.evaluate((c) => (c.dataset.madeOnce = "yes"));
    const label = online.locator("[data-claim-label]").first();
    // Where the claim's name sits within the map (the line above the map may come and go).
    const inMap = async () => {
      const [l, m] = [(await label.boundingBox())!, (await online.boundingBox())!];
      return { x: l.x - m.x, y: l.y - m.y };
    };
    // Where it sits once the map has come to rest (no glide after a drag, no easing).
    const atRest = async () => {
      let last = await inMap();
      for (;;) {
        await page.waitForTimeout(250);
        const now = await inMap();
        if (Math.abs(now.x - last.x) < 0.5 && Math.abs(now.y - last.y) < 0.5) return now;
        last = now;
      }
    };
    const before = await atRest();
    const area = (await online.boundingBox())!;
    await page.mouse.move(area.x + area.width / 2, area.y + area.height / 2);
    await page.mouse.down();
    await page.mouse.move(area.x + area.width / 2 + 60, area.y + area.height / 2 + 40, { steps: 10 });
    // Held still before letting go: a release at speed would glide on.
    await page.waitForTimeout(300);
    await page.mouse.up();
    const panned = await atRest();
    expect(panned.x - before.x).toBeGreaterThan(30);
    const claim = DEMO_CLAIMS[0];
    await context.grantPermissions(["geolocation"], { origin: baseUrl });
    await context.setGeolocation({ latitude: claim.lat, longitude: claim.lon, accuracy: 5 });
    await page.getByRole("button", { name: "Show where I am" }).click();
    // The map has drawn the fix (its box names the position it shows).
    await page.locator(`[data-testid=map][data-me="${claim.lat.toFixed(5)},${claim.lon.toFixed(5)}"]`).waitFor();
    expect(await canvas.getAttribute("data-made-once")).toBe("yes");
    const after = await atRest();
    expect(Math.abs(after.x - panned.x)).toBeLessThan(2);
    expect(Math.abs(after.y - panned.y)).toBeLessThan(2);

    // Settings: the size before, progress while it comes, then counted in the storage line.
    await page.goto(`${baseUrl}/settings`);
    const section = page.getByTestId("basemap-section");
    const keep = section.getByRole("button", { name: /^Keep the basemap on this device \(0\.[1-9] MB\)$/ });
    await keep.waitFor();
    const size = (await keep.textContent())!.match(/\((.+)\)/)![1];
    await page.screenshot({ path: shotPath("basemap-settings-before-phone"), fullPage: true });
    await keep.click();
    await section.getByText("Kept on this device. The map shows the ground with no signal.").waitFor();
    expect(await section.getByTestId("basemap-stored").textContent()).toMatch(new RegExp(`^On this device: ${size}, kept .+, the club's latest\\.$`));
    await page
      .getByTestId("storage-used")
      .filter({ hasText: `of which the offline basemap ${size}.` })
      .waitFor();

    // No signal from here on: the map draws the kept copy.
    await context.setOffline(true);
    await page.goto(`${baseUrl}/map`);
    const map = await mapWithBasemap(page, "offline");
    // Claim names: at least 14 px, hung above their claims, never taking taps from the map.
    const labels = map.locator("[data-claim-label]");
    expect(await labels.count()).toBe(4);
    for (const style of await labels.evaluateAll((els) => els.map((el) => getComputedStyle(el)))) {
      expect(parseFloat(style.fontSize)).toBeGreaterThanOrEqual(14);
      expect(style.pointerEvents).toBe("none");
    }
    await page.screenshot({ path: shotPath("basemap-map-offline-phone"), fullPage: true });
    await map.screenshot({ path: shotPath("basemap-map-offline-phone-map") });

    // A tile address from Settings whose server takes the request and never answers (a weak
    // link): its tiles hold back the map's "load" for as long as they wait, and the ground kept
    // on the phone must not wait with them.
    let asked = 0;
    const hanging = http.createServer(() => asked++);
    await new Promise<void>((resolve) => hanging.listen(0, "127.0.0.1", resolve));
    try {
      await context.setOffline(false);
      await page.goto(`${baseUrl}/settings`);
      const tileField = page.getByLabel("Map tiles address (optional)");
      const tileUrl = `http://127.0.0.1:${(hanging.address() as AddressInfo).port}/{z}/{x}/{y}.png`;
      await tileField.fill(tileUrl);
      await tileField.blur();
      await page.getByRole("status").filter({ hasText: "Saved on this device." }).waitFor();
      // Kept: Settings opened again shows it.
      await page.reload();
      await expect.poll(() => page.getByLabel("Map tiles address (optional)").inputValue()).toBe(tileUrl);
      await page.goto(`${baseUrl}/map`);
      const waiting = page.locator('[data-testid=map][data-basemap="offline"]');
      await waiting.waitFor({ timeout: 30_000 });
      expect(Number(await waiting.getAttribute("data-basemap-tiles"))).toBeGreaterThan(0);
      // The tile server was asked and is still silent: the map has not finished loading.
      expect(asked).toBeGreaterThan(0);
      expect(await waiting.getAttribute("data-map-ready")).toBeNull();
    } finally {
      hanging.closeAllConnections();
      hanging.close();
    }
    await context.close();
  });

  it("an officer replaces the basemap in the console; the member's phone says a newer one is there, fetches it or removes its copy", async () => {
    const officer = await launchPersistent(undefined, LAPTOP);
    dirs.push(officer.userDataDir);
    const desk = await firstPage(officer.context);
    const signIn = new SignInPage(desk, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    await desk.getByRole("heading", { name: /Club console/ }).waitFor();
    await desk.goto(`${baseUrl}/club/claims`);
    const console_ = desk.getByTestId("basemap-upload");
    expect(await console_.getByTestId("basemap-current").textContent()).toMatch(/In place: \d+ kB, PNG tiles at zoom 9–15, since .+\./);

    // A wrong file is refused with its field named, and the basemap in place stays.
    await console_.getByLabel("PMTiles archive").setInputFiles({ name: "ground.pmtiles", mimeType: "application/octet-stream", buffer: Buffer.alloc(4000, 7) });
    await console_.getByRole("button", { name: "Replace the basemap" }).click();
    await console_.getByRole("alert").filter({ hasText: "its magic does not start with" }).waitFor();

    const phone = await launchPersistent(undefined, PHONE);
    dirs.push(phone.userDataDir);
    const page = await firstPage(phone.context);
    await signInToField(page, baseUrl);
    await page.goto(`${baseUrl}/settings`);
    const section = page.getByTestId("basemap-section");
    await section.getByRole("button", { name: /^Keep the basemap on this device/ }).click();
    await section.getByTestId("basemap-stored").waitFor();

    // Zoom 12–14 only: another archive of the same ground.
    await console_
      .getByLabel("PMTiles archive")
      .setInputFiles({ name: "ground.pmtiles", mimeType: "application/octet-stream", buffer: makeDemoBasemap([12, 13, 14]) });
    await console_.getByRole("button", { name: "Replace the basemap" }).click();
    await console_.getByRole("status").filter({ hasText: "The basemap is in place." }).waitFor();
    expect(await console_.getByTestId("basemap-current").textContent()).toMatch(/zoom 12–14/);
    await desk.screenshot({ path: shotPath("basemap-console-laptop"), fullPage: true });

    await page.reload();
    await section.getByTestId("basemap-newer").waitFor();
    await page.screenshot({ path: shotPath("basemap-settings-newer-phone"), fullPage: true });
    await section.getByRole("button", { name: /^Get the newer basemap/ }).click();
    await section.getByText("Kept on this device.").waitFor();
    expect(await section.getByTestId("basemap-newer").count()).toBe(0);

    await section.getByRole("button", { name: "Remove it from this device" }).click();
    await section.getByText(/Removed from this device/).waitFor();
    expect(await section.getByTestId("basemap-stored").count()).toBe(0);
    expect(await page.getByTestId("storage-used").textContent()).not.toMatch(/basemap/);

    // Put the demo's own basemap back for the files that follow.
    await console_.getByLabel("PMTiles archive").setInputFiles({ name: "ground.pmtiles", mimeType: "application/octet-stream", buffer: makeDemoBasemap() });
    await console_.getByRole("button", { name: "Replace the basemap" }).click();
    await console_.getByTestId("basemap-current").filter({ hasText: "zoom 9–15" }).waitFor();
    await officer.context.close();
    await phone.context.close();
  });
});
