import Database from "better-sqlite3";
import { describe, expect, inject, it } from "vitest";
import { launchPersistent, LAPTOP, PHONE, sharedBrowser, shotPath } from "./support/browser";
import { firstPage, signInToField, waitForSyncDone } from "./support/field";
import { DEMO, SignInPage } from "./support/pages";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

/** A placer claim of this season with unmelted gold other than specimens, and one of the member's finds on it. */
function pickClaim() {
  const db = new Database(inject("databaseUrl"), { readonly: true });
  try {
    const year = new Date().getUTCFullYear();
    const start = Date.UTC(year, 0, 1);
    return db
      .prepare(
        `select c.id, c.name, (select f.id from finds f join members m on m.id = f.member_id where f.claim_id = c.id and m.email = ? and f.deleted_at is null limit 1) as memberFind
         from claims c where c.kind = 'placer'
           and (select count(*) from finds f where f.claim_id = c.id and f.kind <> 'specimen' and f.found_at >= ? and f.deleted_at is null
                and not exists (select 1 from recovery_finds rf where rf.find_id = f.id)) >= 2
           and memberFind is not null
         order by c.name limit 1`,
      )
      .get(DEMO.member.email, start) as { id: string; name: string; memberFind: string };
  } finally {
    db.close();
  }
}

describe("a claim's gold learned from a melt, and a member's next weigh-in starting from it (issue 15)", () => {
  it("the officer records a melt, uses the proposed fineness, and the member's phone weighs with it", async () => {
    const claim = pickClaim();
    expect(claim).toBeTruthy();

    const context = await browser().newContext(LAPTOP);
    const page = await context.newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    await page.getByRole("heading", { name: /Club console/ }).waitFor();
    await page.goto(`${baseUrl}/club/claims`);
    const details = page.locator("details").filter({ has: page.locator("summary", { hasText: claim.name }) });
    await details.locator("summary").click();
    const form = details.getByRole("form", { name: `Record a melt or assay on ${claim.name}` });
    const choices = form
      .locator("label")
      .filter({ has: page.locator('input[type="checkbox"]') })
      .filter({ hasNotText: "Specimen" });
    await choices.first().waitFor();
    await choices.nth(0).locator("input").check();
    await choices.nth(1).locator("input").check();
    await form.getByLabel("Fine gold recovered (g)").fill("1.5");
    await form.getByRole("button", { name: "Record it" }).click();
    await form
      .getByRole("status")
      .filter({ hasText: /Recorded: 2 finds/ })
      .waitFor();
    const proposal = details.getByTestId("fineness-proposal");
    await proposal.waitFor();
    const range = (await proposal.locator(".figure").first().textContent())!.match(/\(([\d.]+)–([\d.]+)\)/)!;
    await page.screenshot({ path: shotPath("claim-melt-proposal-laptop"), fullPage: true });
    await proposal.getByRole("button", { name: "Use the proposed fineness" }).click();
    await details.locator("summary", { hasText: `gold ${range[1]}–${range[2]} ‰` }).waitFor();

    // The claim's landowner agreement, then its statement for the season.
    const editor = details.getByRole("form", { name: `Edit ${claim.name}` });
    await editor.getByLabel("Landowner (for the landowner's statement)").fill("Halvorsen Ranch Trust (invented)");
    await editor.getByLabel("Royalty").selectOption("percent_of_value");
    await editor.getByLabel("Rate").fill("5");
    await editor.getByRole("button", { name: "Save the claim" }).click();
    await editor.getByRole("status").filter({ hasText: /Saved/ }).waitFor();
    await page.goto(`${baseUrl}/club/report?claimId=${claim.id}&season=${new Date().getUTCFullYear()}&form=landowner`);
    const statement = page.getByTestId("landowner-statement");
    await statement.getByText("To Halvorsen Ranch Trust (invented)").waitFor();
    expect(await statement.getByTestId("royalty").textContent()).toMatch(/5 % of the value at the club's reference price: [\d.]+ USD/);
    await page.screenshot({ path: shotPath("landowner-statement-laptop"), fullPage: true });
    await context.close();

    // The member's phone: sync, open a find on that claim, and start a weigh-in.
    const { context: phone } = await launchPersistent(undefined, PHONE);
    const member = await firstPage(phone);
    await signInToField(member, baseUrl);
    await waitForSyncDone(member);
    await member.goto(`${baseUrl}/finds/view#id=${claim.memberFind}`);
    await member.getByRole("button", { name: "Weigh this specimen" }).click();
    const fineness = member.getByLabel("Gold fineness");
    await fineness.waitFor();
    const chosen = await fineness.evaluate((el: HTMLSelectElement) => el.options[el.selectedIndex].text);
    expect(chosen).toContain(`${claim.name}'s gold`);
    expect(chosen).toContain(`(${range[1]}–${range[2]})`);
    const host = await member.getByLabel("Host rock").evaluate((el: HTMLSelectElement) => el.options[el.selectedIndex].text);
    expect(host).toContain(`${claim.name}'s rock`);
    await member.screenshot({ path: shotPath("weigh-in-from-claim-profile-phone"), fullPage: true });
    await phone.close();
  });
});
