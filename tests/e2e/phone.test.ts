import type { Page } from "playwright-core";
import { describe, expect, inject, it } from "vitest";
import { MORE_SCREENS } from "@/components/field/tab-bar";
import { COMPILE_HINT } from "../../scripts/lib/compile-hints.mjs";
import { launchPersistent, PHONE, sharedBrowser, shotPath } from "./support/browser";
import { addScale, firstPage, screenDrawn, signInToField, waitForSyncDone } from "./support/field";
import { DEMO } from "./support/pages";
import { memberRecords, memberScreens } from "./support/member-screens";
import { WeighPage } from "./support/weigh-page";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

type Shift = { value: number; moved: string[] };

/** An init script: keeps the page's layout shifts not caused by input, each with what it moved. */
function recordShifts() {
  type Entry = { value: number; hadRecentInput: boolean; sources?: { node?: Node | null }[] };
  const log: Shift[] = [];
  (window as unknown as { shifts: typeof log }).shifts = log;
  new PerformanceObserver((list) => {
    for (const e of list.getEntries() as unknown as Entry[]) {
      if (e.hadRecentInput) continue;
      const moved = (e.sources ?? []).map(({ node }) => {
        const el = node instanceof Element ? node : (node?.parentElement ?? null);
        if (!el) return "?";
        return el.closest("aside[role=note]")
          ? "the caution"
          : `${el.tagName.toLowerCase()}${el.id ? "#" + el.id : ""}.${[...el.classList].slice(0, 3).join(".")}`;
      });
      log.push({ value: e.value, moved });
    }
  }).observe({ type: "layout-shift", buffered: true });
}
const shiftsOf = (page: Page) => page.evaluate(() => (window as unknown as { shifts: Shift[] }).shifts);

describe("the phone in the field (issue 19)", () => {
  it("a first visit loads Today once: the worker taking the page over does not reload it", async () => {
    const { context } = await launchPersistent(undefined, PHONE);
    const page = await firstPage(context);
    await signInToField(page, baseUrl);
    // A reload, if one comes, follows the worker's takeover at once; give it time to come.
    await page.waitForTimeout(1500);
    await page.getByRole("heading", { name: `Good day, ${DEMO.member.firstName}` }).waitFor();
    expect(await page.evaluate(() => (performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming).type)).not.toBe("reload");
    await context.close();
  });
  it("keeps quick find's Save in sight above the tab bar, however long the form runs", async () => {
    const { context } = await launchPersistent(undefined, PHONE);
    const page = await firstPage(context);
    await signInToField(page, baseUrl);
    await page.goto(`${baseUrl}/finds/new`);
    const save = page.getByRole("button", { name: "Save the find" });
    await save.waitFor();
    const tabBar = await page.getByRole("navigation", { name: "Field" }).boundingBox();
    const box = await save.boundingBox();
    expect(box!.y).toBeGreaterThanOrEqual(0);
    expect(box!.y + box!.height).toBeLessThanOrEqual(tabBar!.y);
    await context.close();
  });
  it("keeps a weigh-in's estimate bar and its Save above the tab bar in a find, and at the bottom on the stand-alone page", async () => {
    const { context } = await launchPersistent(undefined, PHONE);
    const page = await firstPage(context);
    await signInToField(page, baseUrl);
    await waitForSyncDone(page);
    const viewport = page.viewportSize()!;
    for (const path of [`/finds/view#id=${memberRecords(inject("databaseUrl")).find}`, "/weigh"]) {
      await page.goto(`${baseUrl}${path}`);
      if (path !== "/weigh") await page.getByRole("button", { name: "Weigh this specimen" }).click();
      await page.locator("#air-0").fill("20.00");
      await page.locator("#water-0").fill("12.50");
      const bar = page.getByTestId("estimate-bar");
      await bar.waitFor();
      // A reading brought into view from out of sight, as little as needed (as the browser does
      // for a field the keyboard would cover), stops above the bar, not under it; the form runs
      // on below, and the bar sticks at the bottom.
      await page.evaluate(() => {
        window.scrollTo(0, 0);
        document.querySelector("#water-0")!.scrollIntoView({ block: "nearest" });
      });
      const box = (await bar.boundingBox())!;
      const reading = (await page.locator("#water-0").boundingBox())!;
      expect(reading.y + reading.height, path).toBeLessThanOrEqual(box.y);
      const floor = path === "/weigh" ? viewport.height : (await page.getByRole("navigation", { name: "Field" }).boundingBox())!.y;
      expect(box.y + box.height, path).toBeLessThanOrEqual(floor);
      expect(box.y + box.height, path).toBeGreaterThan(floor - 24);
      if (path !== "/weigh") {
        const save = (await bar.getByRole("button", { name: "Save" }).boundingBox())!;
        expect(save.y + save.height, path).toBeLessThanOrEqual(floor);
      }
    }
    await context.close();
  });

  it("reaches every member screen from the tab bar, and none scrolls sideways at 320, 360, 390 or 430 px, absurd numbers included", async () => {
    const { context } = await launchPersistent(undefined, PHONE);
    const page = await firstPage(context);
    await signInToField(page, baseUrl);
    await waitForSyncDone(page);

    // Every screen one tap (or "More" and a tap) away.
    const bar = page.getByRole("navigation", { name: "Field" });
    for (const [name, path] of [
      ["Finds", "/finds"],
      ["Outings", "/outings"],
      ["Map", "/map"],
      ["Sync", "/sync"],
      ["Today", "/"],
    ] as const) {
      await bar.getByRole("link", { name, exact: true }).click();
      await page.waitForURL((u) => u.pathname === path);
    }
    for (const screen of MORE_SCREENS) {
      await bar.getByRole("button", { name: "More" }).click();
      await bar.getByRole("link", { name: screen.label }).click();
      await page.waitForURL((u) => u.pathname === screen.href);
      await page.getByRole("heading").first().waitFor();
      if (screen.href !== "/weigh" && screen.href !== "/about") await page.getByRole("navigation", { name: "Field" }).waitFor();
      await page.goto(`${baseUrl}/`);
    }

    const screens = [...memberScreens(memberRecords(inject("databaseUrl"))), "/about"];
    const wide: string[] = [];
    for (const width of [320, 360, 390, 430]) {
      await page.setViewportSize({ width, height: 800 });
      for (const screen of screens) {
        await page.goto(`${baseUrl}${screen}`);
        await screenDrawn(page);
        if (screen === "/weigh") {
          // Absurd readings still give a page that fits.
          const weigh = new WeighPage(page, baseUrl);
          await weigh.readings(["98765.4321", "98765.4322", "98765.43"], ["0.0001", "0.0002", "0.0003"]);
          await page.getByTestId("estimate").or(page.locator(".field-error").first()).first().waitFor();
        }
        const over = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
        if (over > 0) wide.push(`${screen} at ${width}px: ${over}px too wide`);
      }
    }
    await page.setViewportSize({ width: 320, height: 800 });
    await page.goto(`${baseUrl}/weigh`);
    await page.screenshot({ path: shotPath("weigh-320-phone"), fullPage: true });
    expect(wide).toEqual([]);
    await context.close();
  });

  it("asks once to keep the logbook on the device, and signing out with no signal says what happens", async () => {
    const { context } = await launchPersistent(undefined, PHONE);
    const page = await firstPage(context);
    await signInToField(page, baseUrl);
    const prompt = page.getByTestId("storage-prompt");
    await prompt.waitFor();
    // It lies over Today, not above it: Today stands where it stands without it (it was pushed
    // down 260 px when the prompt arrived).
    const headingTop = () => page.getByRole("heading", { name: /Good day/ }).evaluate((h) => h.getBoundingClientRect().top + window.scrollY);
    const withPrompt = await headingTop();
    expect(await prompt.textContent()).toMatch(/waiting for camp sync|until camp sync/);
    await prompt.getByRole("button", { name: "Not now" }).click();
    await prompt.waitFor({ state: "detached" });
    expect(await headingTop()).toBe(withPrompt);
    await page.reload();
    // Today itself, not the frame the page arrives with (its "Good day" has no name).
    await page.getByRole("heading", { name: `Good day, ${DEMO.member.firstName}` }).waitFor();
    await screenDrawn(page);
    // The prompt comes in its own chunk once Today is drawn (it came within this after sign-in).
    await page.waitForTimeout(1500);
    expect(await page.getByTestId("storage-prompt").count()).toBe(0);

    await context.setOffline(true);
    const said = new Promise<string>((resolve) => page.once("dialog", (d) => (resolve(d.message()), void d.accept())));
    await page.getByRole("button", { name: "Sign out" }).click();
    expect(await said).toMatch(/no signal.*stay signed in.*stays on this device/s);
    expect(new URL(page.url()).pathname).toBe("/");
    await context.close();
  });

  it("each member screen's title and lead come in the page itself: there before any script runs or the device's database opens", async () => {
    const context = await browser().newContext(PHONE);
    await signInToField(await context.newPage(), baseUrl);
    // The same session with scripts off: what shows is what the server sent. A screen whose head
    // waited for the member (drawn by script) would show only the site's header here.
    const plain = await browser().newContext({ ...PHONE, javaScriptEnabled: false, storageState: await context.storageState() });
    const page = await plain.newPage();
    const heads: [string, RegExp, RegExp | null][] = [
      ["/", /^Good day/, /Tell someone where you are going/],
      ["/finds", /^Your finds$/, null],
      ["/outings", /^Outings$/, /a day's work on a claim/],
      ["/sync", /^Camp sync$/, /wait on this device until it reaches the club's server/],
      ["/settings", /^Settings$/, /what the club sees of where you found things/],
      ["/scales", /^Scales and setup checks$/, /A setup check weighs an object of known density/],
      ["/barren-rock", /^Barren rock$/, /pieces of gold-free rock/],
      ["/map", /^Map$/, /claims and your finds on the ground/],
    ];
    for (const [path, title, lead] of heads) {
      await page.goto(`${baseUrl}${path}`);
      expect(await page.getByRole("heading", { level: 1 }).textContent(), path).toMatch(title);
      if (lead) expect(await page.locator("main").textContent(), path).toMatch(lead);
      // The body waits for the member: its placeholder, not a blank, and no screen's data.
      expect(await page.locator("main [role=status][aria-label=Loading]").count(), path).toBeGreaterThan(0);
      // The parser reaches the head without stopping for a script: an inline script above it
      // (the early "who is signed in") let the first frame paint an empty page and the app's code
      // run before the head was parsed. The early ask still comes, after the screen's HTML.
      const html = await (await plain.request.get(`${baseUrl}${path}`)).text();
      const beforeEnd = html.slice(html.indexOf("<body"), html.indexOf("</main>"));
      expect(beforeEnd, path).toContain("<h1");
      expect(beforeEnd.match(/<script(?![^>]*\bsrc=)[^>]*>/g), path).toBeNull();
      expect(html.slice(html.indexOf("</main>")), path).toContain('fetch("/api/me"');
    }
    await plain.close();
    await context.close();
  });

  it("each screen's start files open with V8's compile hint (compiled off the main thread as they stream in); the map's MapLibre, loaded on demand, does not", async () => {
    const context = await browser().newContext(PHONE);
    const page = await context.newPage();
    await signInToField(page, baseUrl);
    const startFiles = new Set<string>();
    for (const screen of memberScreens(memberRecords(inject("databaseUrl")))) {
      const html = await (await context.request.get(`${baseUrl}${screen.split("#")[0]}`)).text();
      // Next's polyfills are marked nomodule: a browser that runs the app never loads them.
      const srcs = [...html.matchAll(/<script(?![^>]*\bnoModule)[^>]*\bsrc="([^"]+\.js)"/gi)].map((m) => m[1]);
      expect(srcs.length, screen).toBeGreaterThan(3);
      srcs.forEach((src) => startFiles.add(src));
    }
    for (const src of startFiles) expect((await (await context.request.get(`${baseUrl}${src}`)).text()).startsWith(COMPILE_HINT), src).toBe(true);
    const later: string[] = [];
    page.on("response", (r) => r.request().resourceType() === "script" && later.push(new URL(r.url()).pathname));
    await page.goto(`${baseUrl}/map`);
    await page.locator("[data-testid=map][data-map-ready]").waitFor({ timeout: 30_000 });
    const onDemand = later.filter((src) => !startFiles.has(src));
    const texts = await Promise.all(onDemand.map(async (src) => (await context.request.get(`${baseUrl}${src}`)).text()));
    const mapLibre = texts.filter((text) => text.includes("maplibre"));
    expect(mapLibre.length).toBeGreaterThan(0);
    for (const text of mapLibre) expect(text.startsWith(COMPILE_HINT)).toBe(false);
    await context.close();
  });

  it("nothing moves under the member's eyes: each screen, cleared device first, shifts its layout by less than 0.1 and Today's caution stays put", async () => {
    const signedIn = await browser().newContext(PHONE);
    await signInToField(await signedIn.newPage(), baseUrl);
    // A device with the session and nothing else: no database, no worker (a first visit).
    const context = await browser().newContext({ ...PHONE, storageState: await signedIn.storageState() });
    await signedIn.close();
    await context.addInitScript(recordShifts);
    const page = await context.newPage();
    const shifts = () => shiftsOf(page);
    const records = memberRecords(inject("databaseUrl"));
    const { reviewed } = records;
    const moved: string[] = [];
    for (const screen of memberScreens(records)) {
      await page.goto(`${baseUrl}${screen}`);
      await screenDrawn(page);
      if (screen === "/") await waitForSyncDone(page);
      if (screen === "/map") await page.locator("[data-testid=map][data-map-ready]").waitFor({ timeout: 30_000 });
      if (screen.endsWith(reviewed)) await page.getByTestId("query-thread").waitFor();
      // Reads that answer late (camp sync's pull, a find's photos) have a moment to land.
      await page.waitForTimeout(800);
      const list = await shifts();
      const total = list.reduce((sum, s) => sum + s.value, 0);
      if (total >= 0.1) moved.push(`${screen}: ${total.toFixed(3)} (${list.flatMap((s) => s.moved).join(", ")})`);
      if (screen === "/") expect(list.flatMap((s) => s.moved)).not.toContain("the caution");
    }
    expect(moved).toEqual([]);
    await context.close();
  });

  it("nothing moves when the club's copy comes late: each screen opened first on its own cleared device, camp sync's first pull held 1.5 s, shifts its layout by less than 0.1", async () => {
    // The test above opens only Today on a device with nothing on it. A screen whose list
    // answered "none yet" from the empty device drew its form there, and the pull's records
    // then pushed it down the screen (Scales: 0.24 on Lighthouse's phone).
    const signedIn = await browser().newContext(PHONE);
    const first = await signedIn.newPage();
    await signInToField(first, baseUrl);
    await waitForSyncDone(first);
    // A scale of the member's at the club, so that Scales has a list above its form to pull.
    await addScale(first, baseUrl, "Camp bench scale", "0.1");
    await first.goto(`${baseUrl}/sync`);
    await first.getByText("Nothing waiting.").waitFor({ timeout: 30_000 });
    const session = await signedIn.storageState();
    await signedIn.close();
    const records = memberRecords(inject("databaseUrl"));
    const moved: string[] = [];
    for (const screen of memberScreens(records)) {
      const context = await browser().newContext({ ...PHONE, storageState: session });
      await context.addInitScript(recordShifts);
      await context.route("**/api/sync/pull*", async (route) => {
        await new Promise((r) => setTimeout(r, 1500));
        await route.continue();
      });
      const page = await context.newPage();
      // The stand-alone weigh page keeps no logbook: nothing to pull there.
      const pulled = screen === "/weigh" ? null : page.waitForResponse((r) => r.url().includes("/api/sync/pull"), { timeout: 30_000 });
      await page.goto(`${baseUrl}${screen}`);
      await pulled;
      await screenDrawn(page);
      if (screen === "/map") await page.locator("[data-testid=map][data-map-ready]").waitFor({ timeout: 30_000 });
      if (screen === "/scales") await page.getByRole("listitem", { name: "Camp bench scale" }).waitFor();
      await page.waitForTimeout(800);
      const list = await shiftsOf(page);
      const total = list.reduce((sum, s) => sum + s.value, 0);
      if (total >= 0.1) moved.push(`${screen}: ${total.toFixed(3)} (${list.flatMap((s) => s.moved).join(", ")})`);
      await context.close();
    }
    expect(moved).toEqual([]);
    // Thirteen cold phones, each with its first sync held back: a few seconds each.
  }, 240_000);

  it("dates in the member's language come without an Intl formatter: a cleared German phone opens Today, Finds and Outings making none, each date as Intl writes it", async () => {
    const signedIn = await browser().newContext(PHONE);
    await signInToField(await signedIn.newPage(), baseUrl);
    // A cleared device whose language is German (navigator.language and Accept-Language).
    const context = await browser().newContext({ ...PHONE, locale: "de-DE", storageState: await signedIn.storageState() });
    await signedIn.close();
    await context.addInitScript(() => {
      // Each entry is stamped with its time: the device's one check of its pattern against Intl
      // (date-pattern-store.ts) makes formatters by design, 15 s after start at the earliest.
      const w = window as unknown as { formattersMade: string[]; RealDateTimeFormat: typeof Intl.DateTimeFormat };
      w.formattersMade = [];
      w.RealDateTimeFormat = Intl.DateTimeFormat;
      for (const name of ["DateTimeFormat", "NumberFormat"] as const) {
        const Real = Intl[name] as unknown as new (...args: unknown[]) => object;
        (Intl as unknown as Record<string, unknown>)[name] = new Proxy(Real, {
          construct(target, args) {
            w.formattersMade.push(`@${Math.round(performance.now())} ${name} ${new Error().stack?.split("\n")[2]?.trim() ?? ""}`);
            return Reflect.construct(target, args) as object;
          },
          apply(target, self, args) {
            w.formattersMade.push(`@${Math.round(performance.now())} ${name}() ${new Error().stack?.split("\n")[2]?.trim() ?? ""}`);
            return Reflect.apply(target, self, args) as object;
          },
        });
      }
      for (const name of ["toLocaleDateString", "toLocaleString", "toLocaleTimeString"] as const) {
        const real = Date.prototype[name];
        Date.prototype[name] = function (this: Date, ...args: []) {
          w.formattersMade.push(`@${Math.round(performance.now())} Date.${name}`);
          return real.apply(this, args);
        };
      }
    });
    const page = await context.newPage();
    const records = memberRecords(inject("databaseUrl"));
    // Where each screen shows a date, and whether with its time (formatWhen) or without (formatDay).
    const screens: [string, string, "day" | "when"][] = [
      ["/", "main a[href^='/finds/view']", "day"],
      ["/finds", "main a[href^='/finds/view']", "day"],
      ["/outings", "main a[href^='/outings/view']", "day"],
      [`/outings/view#id=${records.outing}`, "main h1", "when"],
    ];
    for (const [screen, dated, style] of screens) {
      await page.goto(`${baseUrl}${screen}`);
      await screenDrawn(page);
      if (screen === "/") await waitForSyncDone(page);
      await page.locator(dated).first().waitFor();
      const made = await page.evaluate(() => (window as unknown as { formattersMade: string[] }).formattersMade);
      expect(
        made.filter((m) => Number(/^@(\d+)/.exec(m)?.[1]) < 12_000),
        screen,
      ).toEqual([]);
      // Each date shown is the text the browser's own Intl writes for that record, in German.
      const shown = await page.evaluate(async (dated) => {
        const w = window as unknown as { RealDateTimeFormat: typeof Intl.DateTimeFormat };
        const member = JSON.parse(localStorage.getItem("lodebook-member") ?? "null") as { id: string };
        const db = await new Promise<IDBDatabase>((resolve, reject) => {
          const r = indexedDB.open(`lodebook-member-${member.id}`);
          r.onsuccess = () => resolve(r.result);
          r.onerror = () => reject(r.error);
        });
        const get = (store: string, id: string) =>
          new Promise<Record<string, number>>((resolve) => {
            const q = db.transaction(store).objectStore(store).get(id);
            q.onsuccess = () => resolve(q.result as Record<string, number>);
          });
        const day = new w.RealDateTimeFormat("de-DE", { dateStyle: "medium" });
        const when = new w.RealDateTimeFormat("de-DE", { dateStyle: "medium", timeStyle: "short" });
        const out: { text: string; day: string; when: string }[] = [];
        for (const el of [...document.querySelectorAll<HTMLElement>(dated)].slice(0, 12)) {
          const href = el.getAttribute("href") ?? location.pathname + location.hash;
          const id = /id=([^&]+)/.exec(href)?.[1] ?? "";
          const outing = href.startsWith("/outings");
          const record = await get(outing ? "outings" : "finds", id);
          const at = outing ? record.startedAt : record.foundAt;
          out.push({ text: el.textContent ?? "", day: day.format(at), when: when.format(at) });
        }
        db.close();
        return out;
      }, dated);
      expect(shown.length, screen).toBeGreaterThan(0);
      for (const { text, day, when } of shown) {
        expect(day, screen).toMatch(/^\d{2}\.\d{2}\.\d{4}$/);
        expect(when, screen).toMatch(/^\d{2}\.\d{2}\.\d{4}, \d{2}:\d{2}$/);
        expect(text, screen).toContain(style === "when" ? when : day);
      }
    }
    await context.close();
  });
});
