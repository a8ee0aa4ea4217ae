import Database from "better-sqlite3";
import { describe, expect, inject, it } from "vitest";
import { LAPTOP, PHONE, shotPath, sharedBrowser } from "./support/browser";
import { axeViolations, signInToField, waitForSyncDone } from "./support/field";
import { DEMO, SignInPage } from "./support/pages";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

describe("the club console", () => {
  it("filters the ledger to a claim and season, verifies one find and queries another; the member's device shows both after sync", async () => {
    const db = new Database(inject("databaseUrl"), { readonly: true });
    const ines = db.prepare("select id from members where email = ?").get(DEMO.member.email) as { id: string };
    const target = db
      .prepare(
        "select f.claim_id claimId, c.name claimName, strftime('%Y', f.found_at / 1000, 'unixepoch') season, count(*) n from finds f join claims c on c.id = f.claim_id where f.member_id = ? and f.deleted_at is null group by f.claim_id, season order by n desc limit 1",
      )
      .get(ines.id) as { claimId: string; claimName: string; season: string; n: number };
    db.close();
    expect(target.n).toBeGreaterThanOrEqual(2);

    const page = await (await browser().newContext(LAPTOP)).newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    await page.getByRole("heading", { name: /Club console/ }).waitFor();
    await page.goto(`${baseUrl}/club/ledger`);
    const filters = page.getByRole("form", { name: "Ledger filters" });
    await filters.getByLabel("Claim").selectOption({ label: target.claimName });
    await filters.getByLabel("Season").selectOption(target.season);
    await filters.getByLabel("Member").selectOption({ label: "Ines Varga" });
    await expect
      .poll(() => new URL(page.url()).search, { timeout: 15_000 })
      .toMatch(new RegExp(`(?=.*claimId=${target.claimId})(?=.*season=${target.season})(?=.*memberId=${ines.id})`));
    await page
      .getByTestId("total-finds")
      .filter({ hasText: String(target.n) })
      .waitFor();
    const rows = page.getByTestId("ledger-table").locator("tbody tr");
    await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(target.n);
    const [verified, queried] = [await rows.nth(0).getAttribute("data-find"), await rows.nth(1).getAttribute("data-find")];

    await rows.nth(0).click();
    const panel = page.getByTestId("find-panel");
    await panel.getByRole("button", { name: "Verify" }).click();
    await panel.getByTestId("review-history").getByText("Verified").waitFor();
    await page.screenshot({ path: shotPath("club-ledger-laptop"), fullPage: true });

    await rows.nth(1).click();
    await panel
      .getByTestId("review-history")
      .locator("li")
      .first()
      .waitFor({ state: "detached" })
      .catch(() => undefined);
    await panel.getByRole("button", { name: "Query" }).click();
    await panel.getByText("Say what the member should look at.").waitFor();
    await panel.getByLabel("Note to the member").fill("Please weigh it again with the line tared under water.");
    await panel.getByRole("button", { name: "Query" }).click();
    await panel.getByTestId("review-history").getByText("Queried").waitFor();
    await page.getByRole("combobox", { name: "Review" }).selectOption("queried");
    await page.getByTestId("total-finds").filter({ hasText: /^1$/ }).waitFor();

    // The printable report renders, and prints to PDF.
    await page.goto(`${baseUrl}/club/report?claimId=${target.claimId}&season=${target.season}`);
    await page.getByTestId("report").getByText("Estimates are not assays.").waitFor();
    await page.emulateMedia({ media: "print" });
    await page.screenshot({ path: shotPath("club-report-print-laptop"), fullPage: true });
    const pdf = await page.pdf({ path: "test-results/club-report.pdf", format: "A4" });
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    await page.context().close();

    // The member's device gets both reviews at its next sync.
    const phone = await (await browser().newContext(PHONE)).newPage();
    await signInToField(phone, baseUrl);
    await waitForSyncDone(phone);
    await phone.goto(`${baseUrl}/finds/view#id=${verified}`);
    // Every verify on that find reaches the phone: the demo club may have verified it before.
    const reviewDb = new Database(inject("databaseUrl"), { readonly: true });
    const verifies = (reviewDb.prepare("select count(*) n from reviews where find_id = ? and action = 'verify'").get(verified) as { n: number }).n;
    reviewDb.close();
    expect(verifies).toBeGreaterThanOrEqual(1);
    await expect.poll(() => phone.getByTestId("query-thread").locator('[data-action="verify"]').count(), { timeout: 15_000 }).toBe(verifies);
    await phone.goto(`${baseUrl}/finds/view#id=${queried}`);
    await phone.getByTestId("query-thread").getByText("Please weigh it again with the line tared under water.").waitFor();
    await phone.screenshot({ path: shotPath("member-sees-query-phone"), fullPage: true });
    await phone.context().close();
  });

  it("fails none of Lighthouse's accessibility rules on any console screen, the ledger's find panel open too (axe-core)", async () => {
    const page = await (await browser().newContext(LAPTOP)).newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    await page.getByRole("heading", { name: /Club console/ }).waitFor();
    const found: Record<string, string[]> = {};
    const check = async (name: string) => {
      const v = await axeViolations(page);
      if (v.length) found[name] = v;
    };
    for (const path of ["/club", "/club/ledger", "/club/claims", "/club/members", "/club/prices", "/club/report", "/club/mail"]) {
      await page.goto(`${baseUrl}${path}`);
      await page.locator("main h1").first().waitFor();
      await page.waitForLoadState("networkidle");
      await check(path);
    }
    await page.goto(`${baseUrl}/club/ledger`);
    await page.getByTestId("ledger-table").locator("tbody tr").first().click();
    await page.getByTestId("find-panel").getByText("Position").waitFor();
    await check("/club/ledger, a find's panel open");
    expect(found).toEqual({});
    await page.context().close();
  });

  it("the ledger's first page, the monthly bars and the claims plan arrive with the page: there before any script runs", async () => {
    const context = await browser().newContext(LAPTOP);
    const officer = await context.newPage();
    const signIn = new SignInPage(officer, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    await officer.getByRole("heading", { name: /Club console/ }).waitFor();
    const db = new Database(inject("databaseUrl"), { readonly: true });
    const kept = (db.prepare("select count(*) n from finds where deleted_at is null and kind = 'nugget'").get() as { n: number }).n;
    const outlined = (db.prepare("select count(*) n from claims where boundary is not null").get() as { n: number }).n;
    db.close();
    // The same session, with scripts off: what the server sent is all there is.
    const plain = await browser().newContext({ ...LAPTOP, javaScriptEnabled: false, storageState: await context.storageState() });
    const page = await plain.newPage();
    await page.goto(`${baseUrl}/club/ledger?kind=nugget`);
    expect(await page.getByTestId("total-finds").textContent()).toBe(String(kept));
    expect(await page.getByTestId("ledger-table").locator("tbody tr").count()).toBe(Math.min(kept, 50));

    // The season at a glance is drawn on the server too: the bars with their figures, and the
    // claims plan with every outlined claim named in text of at least 14 px.
    await page.goto(`${baseUrl}/club`);
    const chart = page.getByTestId("production-chart");
    const monthRows = await chart.locator("tbody tr").count();
    expect(monthRows).toBeGreaterThan(0);
    const plan = page.getByTestId("claims-plan");
    expect(await plan.locator("svg path[fill-rule]").count()).toBe(outlined);
    const labels = plan.locator("span", { hasText: / fine$/ });
    expect(await labels.count()).toBe(outlined);
    for (const size of await labels.evaluateAll((els) => els.map((e) => parseFloat(getComputedStyle(e).fontSize)))) expect(size).toBeGreaterThanOrEqual(14);
    await plain.close();
    await context.close();
  });
  for (const viewport of [
    { width: 1366, height: 768 },
    { width: 1280, height: 800 },
  ]) {
    it(`the ledger fits a ${viewport.width}×${viewport.height} laptop: every column, whole filter boxes, and with the find panel open no sideways scrolling`, async () => {
      const page = await (await browser().newContext({ viewport })).newPage();
      const signIn = new SignInPage(page, baseUrl);
      await signIn.open();
      await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
      await page.getByRole("heading", { name: /Club console/ }).waitFor();
      await page.goto(`${baseUrl}/club/ledger`);
      const table = page.getByTestId("ledger-table");
      await table.locator("tbody tr").first().waitFor();

      /** What sticks out: the page wider than the window, the table wider than its sheet, headers past the right edge, filter texts cut. */
      const overflow = () =>
        page.evaluate(() => {
          const sheet = document.querySelector('[data-testid="ledger-table"]')!.parentElement!;
          const right = Math.min(innerWidth, sheet.getBoundingClientRect().right);
          const ctx = document.createElement("canvas").getContext("2d")!;
          const cut = [
            ...document.querySelectorAll<HTMLSelectElement | HTMLInputElement>(
              'form[aria-label="Ledger filters"] select, form[aria-label="Ledger filters"] input',
            ),
          ].filter((el) => {
            const style = getComputedStyle(el);
            ctx.font = `${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
            const text = el instanceof HTMLSelectElement ? el.options[el.selectedIndex].text : "0000-00-00";
            // Padding, border and the control's own arrow or calendar button (about 24 px).
            const room = el.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight) - 24;
            return ctx.measureText(text).width > room;
          });
          return {
            page: document.documentElement.scrollWidth - innerWidth,
            table: sheet.scrollWidth - sheet.clientWidth,
            headersPastEdge: [...document.querySelectorAll('[data-testid="ledger-table"] th')]
              .filter((th) => th.getBoundingClientRect().right > right + 1)
              .map((th) => th.textContent),
            headers: [...document.querySelectorAll('[data-testid="ledger-table"] th')].map((th) => th.textContent?.replace(/[↓↑]/g, "").trim()),
            cut: cut.map((el) => el.closest("label")?.querySelector("span")?.textContent),
          };
        });
      const closed = await overflow();
      expect(closed).toMatchObject({ page: 0, table: 0, headersPastEdge: [], cut: [] });
      expect(closed.headers).toEqual(["Found", "Member", "Claim", "Kind", "Method", "Weight", "Fine gold (est.)", "Value", "Review"]);
      await page.screenshot({ path: shotPath(`club-ledger-${viewport.width}`) });

      await table.locator("tbody tr").first().click();
      await page.getByTestId("find-panel").getByText("Position").waitFor();
      const open = await overflow();
      expect(open).toMatchObject({ page: 0, table: 0, headersPastEdge: [] });
      // Method and weight step aside (they are in the panel); the review state stays in view.
      expect(open.headers).toEqual(["Found", "Member", "Claim", "Kind", "Fine gold (est.)", "Value", "Review"]);
      await page.screenshot({ path: shotPath(`club-ledger-panel-${viewport.width}`) });
      await page.context().close();
    });
  }
});
