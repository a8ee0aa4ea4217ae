import fs from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { describe, expect, inject, it } from "vitest";
import { LAPTOP, PHONE, shotPath, sharedBrowser } from "./support/browser";
import { deviceRecords, signInToField, tab, waitForSyncDone } from "./support/field";
import { DEMO, SignInPage } from "./support/pages";
import { OfficerFindPanel, PhoneFindThread } from "./support/query-thread";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

/** The mail catcher's message to the member about this find's query (other tests mail the member too). */
async function queryMail(findId: string): Promise<{ subject: string; text: string }> {
  const dir = inject("mailDir");
  let found: { subject: string; text: string } | undefined;
  await expect
    .poll(
      () => {
        const all = fs.existsSync(dir) ? fs.readdirSync(dir).filter((f) => f.endsWith(".json")) : [];
        found = all
          .map((f) => JSON.parse(fs.readFileSync(path.join(dir, f), "utf8")) as { to: string[]; subject: string; text: string })
          .find((m) => m.to.includes(DEMO.member.email) && /queried/.test(m.subject) && m.text.includes(findId));
        return found !== undefined;
      },
      { timeout: 15_000 },
    )
    .toBe(true);
  return found!;
}

/** The officer signs in on a laptop, opens the member's find in the ledger and queries it. */
async function officerQueries(memberId: string, findId: string, question: string) {
  const laptop = await (await browser().newContext(LAPTOP)).newPage();
  const signIn = new SignInPage(laptop, baseUrl);
  await signIn.open();
  await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
  await laptop.getByRole("heading", { name: /Club console/ }).waitFor();
  await laptop.goto(`${baseUrl}/club/ledger?memberId=${memberId}&state=new`);
  await laptop.locator(`tbody tr[data-find="${findId}"]`).click();
  const panel = new OfficerFindPanel(laptop);
  await panel.query(question);
  return { laptop, panel };
}

/** Camp sync now, and until nothing waits on the device. */
async function syncUntilSent(phone: import("playwright-core").Page) {
  await tab(phone, "Sync");
  await phone.getByRole("button", { name: "Sync now" }).click();
  await phone
    .getByTestId("sync-waiting")
    .filter({ hasText: /Waiting to send: 0 changes$/ })
    .waitFor({ timeout: 30_000 });
  await waitForSyncDone(phone);
}

describe("the query thread (issue 18)", () => {
  it("officer queries; the member sees the mark, answers and corrects offline, syncs; the officer sees it answered and verifies; both see the thread", async () => {
    const db = new Database(inject("databaseUrl"), { readonly: true });
    const ines = db.prepare("select id from members where email = ?").get(DEMO.member.email) as { id: string };
    const find = db
      .prepare(
        "select id, kind from finds where member_id = ? and deleted_at is null and review_state = 'new' and not exists (select 1 from reviews r where r.find_id = finds.id) order by found_at desc limit 1",
      )
      .get(ines.id) as { id: string; kind: string };
    db.close();
    const question = "The weight looks high for its size: was the scale tared?";
    const reply = "It was not; I weighed it again at camp and corrected the notes.";

    // The member asks to be told by e-mail, and the setting goes to the club.
    const phoneContext = await browser().newContext(PHONE);
    const phone = await phoneContext.newPage();
    await signInToField(phone, baseUrl);
    await waitForSyncDone(phone);
    await phone.goto(`${baseUrl}/settings`);
    // The box follows the device's stored setting, so it turns on once saved there.
    const mailBox = phone.getByLabel("E-mail me when an officer queries one of my finds");
    await mailBox.click();
    await expect.poll(() => mailBox.isChecked()).toBe(true);
    await syncUntilSent(phone);

    // The officer queries the find from the ledger.
    const { laptop, panel } = await officerQueries(ines.id, find.id, question);

    // The member is told by e-mail, with a link to the find.
    const mail = await queryMail(find.id);
    expect(mail.text).toContain(question);
    expect(mail.text).toContain(`/finds/view#id=${find.id}`);
    // The demo's caught-mail page shows it too.
    await laptop.goto(`${baseUrl}/club/mail`);
    await laptop.getByRole("heading", { name: mail.subject }).first().waitFor();

    // The phone pulls the query: a mark on Today and in the finds list.
    await syncUntilSent(phone);
    await tab(phone, "Today");
    const waiting = phone.getByTestId("queried-finds");
    await waiting.locator(`a[href="/finds/view#id=${find.id}"]`).waitFor();
    await phone.screenshot({ path: shotPath("query-today-mark-phone"), fullPage: true });
    await tab(phone, "Finds");
    await phone.getByTestId("query-mark").first().waitFor();

    // Offline: the member reads the query with its date, answers it and corrects the find.
    await phoneContext.setOffline(true);
    await tab(phone, "Today");
    await waiting.locator(`a[href="/finds/view#id=${find.id}"]`).click();
    const thread = new PhoneFindThread(phone);
    await thread.thread.getByText(question).waitFor();
    const stamp = await thread.thread.locator('[data-action="query"] time').textContent();
    expect(stamp).not.toMatch(/Invalid Date/);
    expect(stamp).toMatch(/\d/);
    await phone.getByLabel("Notes").fill("re-weighed at camp, scale tared");
    await phone.getByRole("button", { name: "Save changes" }).click();
    await phone.getByText("Saved on this device.").waitFor();
    await thread.answer(reply);
    await thread.thread.getByText("on this device, goes at the next camp sync").waitFor();
    expect((await deviceRecords(phone)).outbox).toBeGreaterThanOrEqual(2);
    await phone.screenshot({ path: shotPath("query-answer-offline-phone"), fullPage: true });

    // Back in signal: camp sync sends the answer and the correction.
    await phoneContext.setOffline(false);
    await syncUntilSent(phone);

    // The officer sees "answered" and "changed since the query", reads the thread, verifies.
    await laptop.goto(`${baseUrl}/club/ledger?memberId=${ines.id}&state=answered`);
    const row = laptop.locator(`tbody tr[data-find="${find.id}"]`);
    await row.locator('[data-state="answered"]').waitFor();
    await row.getByTestId("changed-since-query").waitFor();
    await row.click();
    await panel.thread.getByText(reply).waitFor();
    expect(await panel.steps()).toEqual(["query", "edit", "answer"]);
    // Only what the member changed: the found time is kept to the millisecond through the form.
    await panel.thread.locator('[data-kind="edit"]').getByText("The member changed the find (notes)").waitFor();
    await laptop.screenshot({ path: shotPath("query-answered-ledger-laptop"), fullPage: true });
    await panel.verify();
    expect(await panel.steps()).toEqual(["query", "edit", "answer", "verify"]);
    for (const t of await panel.thread.locator("time").allTextContents()) expect(t).not.toMatch(/Invalid Date/);

    // The member's phone gets the verification: the whole thread, in order, and no mark left.
    await syncUntilSent(phone);
    await phone.goto(`${baseUrl}/finds/view#id=${find.id}`);
    await thread.thread.locator('[data-action="verify"]').waitFor();
    const steps = await thread.steps();
    expect(steps.filter((s) => s !== "edit")).toEqual(["query", "answer", "verify"]);
    expect(steps.indexOf("edit")).toBeGreaterThan(0);
    for (const t of await thread.thread.locator("time").allTextContents()) expect(t).not.toMatch(/Invalid Date/);
    await phone.screenshot({ path: shotPath("query-thread-verified-phone"), fullPage: true });
    await tab(phone, "Today");
    await phone.getByRole("heading", { name: `Good day, ${DEMO.member.firstName}` }).waitFor();
    expect(await phone.locator(`[data-testid="queried-finds"] a[href="/finds/view#id=${find.id}"]`).count()).toBe(0);

    await laptop.context().close();
    await phoneContext.close();
  });

  it("a query that arrives while the member has the find open joins the screen: what they were typing stays", async () => {
    const db = new Database(inject("databaseUrl"), { readonly: true });
    const ines = db.prepare("select id from members where email = ?").get(DEMO.member.email) as { id: string };
    const find = db
      .prepare(
        "select id from finds where member_id = ? and deleted_at is null and review_state = 'new' and not exists (select 1 from reviews r where r.find_id = finds.id) order by found_at asc limit 1",
      )
      .get(ines.id) as { id: string };
    db.close();

    // The member opens the find (no thread yet, so its code is not on this page) and starts typing.
    const phoneContext = await browser().newContext(PHONE);
    const phone = await phoneContext.newPage();
    await signInToField(phone, baseUrl);
    await waitForSyncDone(phone);
    await phone.goto(`${baseUrl}/finds/view#id=${find.id}`);
    const notes = phone.getByLabel("Notes");
    await notes.fill("half written, not saved yet");
    expect(await phone.getByTestId("query-thread").count()).toBe(0);

    // Meanwhile the officer queries it.
    const question = "Which pan did this come from?";
    const { laptop } = await officerQueries(ines.id, find.id, question);

    // Camp sync runs when the link comes back (the member stays on the find); the query appears
    // on the open screen, and the screen was never taken away: the typing is still there.
    await phoneContext.setOffline(true);
    await phoneContext.setOffline(false);
    await new PhoneFindThread(phone).thread.getByText(question).waitFor({ timeout: 30_000 });
    expect(await notes.inputValue()).toBe("half written, not saved yet");

    await laptop.context().close();
    await phoneContext.close();
  });
});
