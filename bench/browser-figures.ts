import zlib from "node:zlib";
import { v7 as uuidv7 } from "uuid";
import { encode } from "next-auth/jwt";
import type { Browser, Page } from "playwright-core";
import { PROTOCOL_VERSION } from "../src/lib/sync/protocol";
import { engineScript } from "../tests/support/engine-script";
import { addPhotoPage } from "./photo-figures";
import { percentile, repeat, report, summary } from "./stats";

const MEMBER_SCREENS = [
  "/",
  "/finds",
  "/finds/new",
  "/finds/view",
  "/outings",
  "/outings/view",
  "/map",
  "/sync",
  "/settings",
  "/scales",
  "/barren-rock",
  "/weigh",
];

async function firstLoadJs(baseUrl: string, route: string): Promise<{ gzip: number; sources: string[] }> {
  const html = await (await fetch(`${baseUrl}${route}`)).text();
  // What a current browser fetches: scripts marked noModule (Next's polyfills for old
  // browsers) are skipped by every browser that runs modules, so they are not counted.
  const sources = [...html.matchAll(/<script[^>]+src="([^"]+)"[^>]*>/g)].filter((m) => !/\bnoModule\b/i.test(m[0])).map((m) => m[1]);
  let gzip = 0;
  const bodies: string[] = [];
  for (const src of sources) {
    const body = Buffer.from(await (await fetch(new URL(src, baseUrl))).arrayBuffer());
    gzip += zlib.gzipSync(body, { level: 9 }).length;
    bodies.push(body.toString("utf8"));
  }
  return { gzip, sources: bodies };
}

/** First-load JavaScript (gzip) of each member screen against the bare page of the same build. */
export async function pageWeight(baseUrl: string) {
  const bare = await firstLoadJs(baseUrl, "/about");
  const withMap: string[] = [];
  const withReader: string[] = [];
  for (const route of MEMBER_SCREENS) {
    const page = await firstLoadJs(baseUrl, route);
    if (page.sources.some((s) => s.includes("maplibregl") || s.includes("MapLibre GL JS"))) withMap.push(route);
    // A message of the pmtiles package's own, kept by minifiers.
    if (page.sources.some((s) => s.includes("Wrong magic number for PMTiles archive"))) withReader.push(route);
    const ratio = page.gzip / bare.gzip;
    report(`page weight ${route}`, {
      value: [page.gzip / 1024],
      unit: "kB gzip first load",
      ratio: [ratio],
      ratioLabel: `× the bare page (${(bare.gzip / 1024).toFixed(1)} kB)`,
      goal: "≤ 1.3×",
      pass: ratio <= 1.3,
    });
  }
  report("MapLibre in a first load", {
    value: [withMap.length],
    unit: `screens (${withMap.join(", ") || "none"}): it loads with the map screen only`,
    goal: "0",
    pass: withMap.length === 0,
  });
  report("PMTiles reader in a first load", {
    value: [withReader.length],
    unit: `screens (${withReader.join(", ") || "none"}): it loads with the map screen only`,
    goal: "0",
    pass: withReader.length === 0,
  });
}

export async function signIn(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.getByRole("heading", { name: /Good day/ }).waitFor();
  await page.waitForFunction(
    async () => (await navigator.serviceWorker.ready).active?.state === "activated" && !!navigator.serviceWorker.controller,
    undefined,
    { timeout: 60_000 },
  );
  await page.locator('[data-testid="sync-status"][data-kind="done"]').first().waitFor({ timeout: 60_000 });
}

/** Offline open of the member home from the service worker's cache, CPU slowed 4×, against the online open. */
export async function offlineOpen(browser: Browser, baseUrl: string) {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await signIn(page, baseUrl, "ines@quillmarsh.example", "member-demo-pass");
  const cdp = await context.newCDPSession(page);
  await cdp.send("Emulation.setCPUThrottlingRate", { rate: 4 });
  const open = async () => {
    const t = performance.now();
    await page.goto(`${baseUrl}/`);
    await page.getByRole("heading", { name: /Good day/ }).waitFor();
    await page.getByTestId("tally-finds").filter({ hasText: /\d/ }).waitFor();
    return performance.now() - t;
  };
  const online = await repeat(5, open);
  await context.setOffline(true);
  const offline = await repeat(5, open);
  await context.close();
  report("offline open of Today (service worker cache, CPU 4× slower)", {
    value: offline,
    unit: "ms to interactive",
    ratio: offline.map((o, i) => o / online[i]),
    ratioLabel: "× the online open",
    goal: "≤ 1200 ms (median)",
    pass: summary(offline).median <= 1200,
  });
}

/** A session cookie as signing in would set it, with its session row in the database. */
export async function memberCookie(m: { id: string; email: string }): Promise<string> {
  const { openSession } = await import("../src/server/auth/sessions");
  return `authjs.session-token=${await encode({ token: { sub: m.id, email: m.email, sv: 0, sid: openSession(m.id) }, secret: process.env.AUTH_SECRET!, salt: "authjs.session-token" })}`;
}

/** 50 members pushing 100-change batches at once on loopback. */
export async function concurrency(baseUrl: string, members: { id: string; email: string }[], countFinds: (ids: string[]) => number) {
  const cookies = await Promise.all(members.map(memberCookie));
  // One push first, not counted: it loads the route's module, as any running server has.
  await fetch(`${baseUrl}/api/sync/push`, {
    method: "POST",
    headers: { "content-type": "application/json", cookie: cookies[0], origin: baseUrl },
    body: JSON.stringify({
      protocolVersion: PROTOCOL_VERSION,
      clientId: uuidv7(),
      mutations: [{ id: 1, name: "settings.put", args: { locationSharing: "exact" } }],
    }),
  });
  // Three rounds, each with fresh devices; the bodies are made before the clock starts, so
  // the load generator (on the same two cores) does as little as it can while timed.
  const ids: string[] = [];
  const p95s: number[] = [];
  let errors = 0;
  for (let round = 0; round < 3; round++) {
    const bodies = cookies.map((cookie) => {
      const mutations = Array.from({ length: 100 }, (_, i) => {
        const id = uuidv7();
        ids.push(id);
        return {
          id: i + 1,
          name: "find.put",
          args: {
            id,
            outingId: null,
            claimId: null,
            kind: "flakes",
            weightGrams: 0.4,
            depthCm: null,
            method: "panning",
            notes: "",
            lat: null,
            lon: null,
            accuracyM: null,
            locationSource: null,
            foundAt: 1780000000000 + i,
          },
        };
      });
      return { cookie, body: JSON.stringify({ protocolVersion: PROTOCOL_VERSION, clientId: uuidv7(), mutations }) };
    });
    const latencies = await Promise.all(
      bodies.map(async ({ cookie, body }) => {
        const t = performance.now();
        const res = await fetch(`${baseUrl}/api/sync/push`, { method: "POST", headers: { "content-type": "application/json", cookie, origin: baseUrl }, body });
        await res.arrayBuffer();
        if (res.status !== 200) errors++;
        return performance.now() - t;
      }),
    );
    p95s.push(percentile(latencies, 95));
  }
  const lost = ids.length - countFinds(ids);
  const p95 = summary(p95s).median;
  report(`concurrency: 50 members × 100 changes at once, 3 rounds (${errors} errors, ${lost} lost)`, {
    value: p95s,
    unit: "ms p95 per push",
    goal: "0 errors, 0 lost, p95 ≤ 500 ms (median round)",
    pass: errors === 0 && lost === 0 && p95 <= 500,
  });
}

/** A 12-megapixel camera JPEG of a painted specimen (bench/specimen-photo.ts), shrunk in Chromium by the device's own code. */
export async function photoBytes(browser: Browser, baseUrl: string) {
  const page = await (await browser.newContext()).newPage();
  await page.goto(`${baseUrl}/about`);
  await addPhotoPage(page);
  const sizes = await page.evaluate(async () => {
    const lib = (window as unknown as { lodebookBenchPhotos: typeof import("./photo-page") }).lodebookBenchPhotos;
    const out: { original: number; shrunk: number }[] = [];
    for (const seed of [21, 22, 23]) {
      const original = await lib.cameraJpeg(seed);
      out.push({ original: original.size, shrunk: (await lib.shrinkImage(original)).blob.size });
    }
    return out;
  });
  await page.context().close();
  const ratio = sizes.map((s) => s.shrunk / s.original);
  report(`photo upload size (painted 12 MP camera JPEGs of ${(sizes[0].original / 1024 / 1024).toFixed(1)} MB, shrunk on the device)`, {
    value: sizes.map((s) => s.shrunk / 1024),
    unit: "kB",
    ratio,
    ratioLabel: "of the original",
    goal: "≤ 0.15",
    pass: Math.max(...ratio) <= 0.15,
  });
}

/** The estimate in Chromium: one call, and a 10 000-sample Monte Carlo. */
export async function estimateBrowser(browser: Browser, baseUrl: string) {
  const page = await (await browser.newContext()).newPage();
  await page.goto(`${baseUrl}/weigh`);
  // The engine's source bundled for the page (the app leaves no hook on globalThis).
  await page.evaluate(await engineScript());
  const input = { method: "hanging", airGrams: [100, 100.01], waterGrams: [62.72], finenessPermille: 825, finenessRangePermille: [700, 950] };
  const result = await page.evaluate((i) => {
    const e = (
      globalThis as unknown as {
        lodebookEngine: { estimateSpecimen: (x: unknown) => unknown; estimateSpecimenMonteCarlo: (x: unknown, n: number, s: number) => unknown };
      }
    ).lodebookEngine;
    const mc: number[] = [];
    for (let r = 0; r < 5; r++) {
      const t = performance.now();
      e.estimateSpecimenMonteCarlo(i, 10_000, r + 1);
      mc.push(performance.now() - t);
    }
    const t = performance.now();
    for (let k = 0; k < 2000; k++) e.estimateSpecimen(i);
    return { mc, perCallUs: ((performance.now() - t) / 2000) * 1000 };
  }, input);
  await page.context().close();
  report("estimate, 10 000-sample Monte Carlo (Chromium; the first, cold run is the max)", {
    value: result.mc,
    unit: "ms",
    goal: "≤ 50 ms (median)",
    pass: summary(result.mc).median <= 50,
  });
  report("estimate, one call (Chromium)", { value: [result.perCallUs], unit: "µs", goal: "reported", pass: true });
}

/** The finds list's first screen with 5 000 finds on the device, against 50. */
export async function deviceLists(browser: Browser, baseUrl: string) {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await signIn(page, baseUrl, "cal@quillmarsh.example", "member-demo-pass");
  const fill = (n: number) =>
    page.evaluate(async (count) => {
      const member = JSON.parse(localStorage.getItem("lodebook-member")!) as { id: string };
      const db = await new Promise<IDBDatabase>((res) => {
        const r = indexedDB.open(`lodebook-member-${member.id}`);
        r.onsuccess = () => res(r.result);
      });
      await new Promise<void>((res) => {
        const tx = db.transaction("finds", "readwrite");
        const store = tx.objectStore("finds");
        store.clear();
        for (let i = 0; i < count; i++)
          store.put({
            id: `bench-${String(i).padStart(6, "0")}`,
            outingId: null,
            claimId: null,
            kind: "flakes",
            weightGrams: 0.1 + i / 1000,
            depthCm: null,
            method: "panning",
            notes: `bench ${i}`,
            lat: null,
            lon: null,
            accuracyM: null,
            locationSource: null,
            foundAt: 1780000000000 - i * 60_000,
            updatedAt: 0,
          });
        tx.oncomplete = () => res();
      });
      db.close();
    }, n);
  const open = (n: number) => async () => {
    const t = performance.now();
    await page.goto(`${baseUrl}/finds`);
    await page
      .getByTestId("finds-count")
      .filter({ hasText: `of ${n} finds` })
      .waitFor();
    await page.getByTestId("finds-list").locator("a").first().waitFor();
    return performance.now() - t;
  };
  await page.route("**/api/sync/**", (r) => r.abort()); // keep sync from changing the list while it is timed
  await fill(50);
  const small = await repeat(3, open(50));
  await fill(5000);
  const large = await repeat(3, open(5000));
  const rendered = await page.getByTestId("finds-list").locator("a").count();
  await context.close();
  report(`device finds list, 5 000 finds (${rendered} rows in the DOM)`, {
    value: large,
    unit: "ms to first screen",
    ratio: large.map((l, i) => l / small[i]),
    ratioLabel: "× with 50 finds",
    goal: "reported; list virtualised",
    pass: rendered < 100,
  });
}
