import fs from "node:fs";
import path from "node:path";
import { describe, expect, inject, it } from "vitest";
import { LAPTOP, PHONE, shotPath, sharedBrowser } from "./support/browser";
import { DEMO, SignInPage, waitForMail } from "./support/pages";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

describe("signing in through the real form", () => {
  it("takes a member to their home for today, without the club console", async () => {
    const context = await browser().newContext(PHONE);
    const page = await context.newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await page.screenshot({ path: shotPath("sign-in-phone"), fullPage: true });
    await signIn.signIn(DEMO.member.email, DEMO.member.password);
    await page.waitForURL(`${baseUrl}/`);
    await page.getByRole("heading", { name: `Good day, ${DEMO.member.firstName}` }).waitFor();
    expect(await page.getByRole("link", { name: "Club console" }).count()).toBe(0);
    await page.screenshot({ path: shotPath("member-home-phone"), fullPage: true });
    // The console itself refuses a member, whatever the UI shows.
    await page.goto(`${baseUrl}/club`);
    await page.waitForURL((url) => url.pathname === "/");
    await context.close();
  });

  it("takes an officer straight to the club console, which counts the club's finds", async () => {
    const context = await browser().newContext(LAPTOP);
    const page = await context.newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    await page.waitForURL(`${baseUrl}/club`);
    await page.getByRole("heading", { name: /Club console/ }).waitFor();
    expect(Number(await page.getByTestId("club-total-finds").textContent())).toBeGreaterThan(0);
    await page.screenshot({ path: shotPath("club-console-laptop"), fullPage: true });
    // The officer's own logbook is one link away.
    await page.goto(`${baseUrl}/`);
    await page.getByRole("link", { name: "Open the club console" }).waitFor();
    await page.screenshot({ path: shotPath("officer-home-laptop"), fullPage: true });
    await context.close();
  });

  it("signs out, and the home page then asks to sign in again", async () => {
    const context = await browser().newContext(PHONE);
    const page = await context.newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.member.email, DEMO.member.password);
    await page.getByRole("heading", { name: /Good day/ }).waitFor();
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.getByText("You are signed out.").waitFor();
    await page.goto(`${baseUrl}/`);
    await page.waitForURL((url) => url.pathname === "/sign-in");
    await context.close();
  });

  it("says clearly when the password is wrong", async () => {
    const context = await browser().newContext(PHONE);
    const page = await context.newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.signIn(DEMO.member.email, "not-the-password");
    // Next's route announcer is an alert too: look for ours by its words.
    const alert = page.getByRole("alert").filter({ hasText: /do not match an active member/ });
    await alert.waitFor();
    expect(await page.getByLabel("Password").getAttribute("aria-invalid")).toBe("true");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await context.close();
  });

  it("signs in by an e-mail link that reaches the mail catcher, once", async () => {
    const context = await browser().newContext(PHONE);
    const page = await context.newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.askForLink(DEMO.officer.email);
    await page.getByText(/a sign-in link is on its way/).waitFor();
    const mail = await waitForMail(inject("mailDir"), DEMO.officer.email);
    expect(mail.subject).toMatch(/sign-in link/);
    const link = mail.text.match(/https?:\/\/\S+/)![0];
    expect(new URL(link).origin).toBe(baseUrl);
    await page.goto(link);
    // An officer lands on the console, by link as by password.
    await page.getByRole("heading", { name: /Club console/ }).waitFor();
    // The same link a second time no longer signs anyone in.
    const fresh = await browser().newContext(PHONE);
    const again = await fresh.newPage();
    await again.goto(link);
    await again.waitForURL((url) => url.pathname === "/sign-in");
    await fresh.close();
    await context.close();
  });
  it("the caught-mail page shows an officer their own sign-in link, never a member's", async () => {
    const dir = inject("mailDir");
    const caught = () => (fs.existsSync(dir) ? fs.readdirSync(dir).filter((f) => f.endsWith(".json")) : []);
    const before = new Set(caught());
    /** The sign-in message to `to` that came since this test began. */
    const newLinkMail = async (to: string) => {
      for (const deadline = Date.now() + 15_000; Date.now() < deadline; await new Promise((r) => setTimeout(r, 200))) {
        for (const f of caught().filter((f) => !before.has(f))) {
          const m = JSON.parse(fs.readFileSync(path.join(dir, f), "utf8")) as { to: string[]; subject: string; text: string };
          if (m.to.includes(to) && /sign-in link/.test(m.subject)) return m;
        }
      }
      throw new Error(`no new sign-in mail to ${to}`);
    };
    const context = await browser().newContext(PHONE);
    const page = await context.newPage();
    const signIn = new SignInPage(page, baseUrl);
    await signIn.open();
    await signIn.askForLink(DEMO.member.email);
    await page.getByText(/a sign-in link is on its way/).waitFor();
    const memberMail = await newLinkMail(DEMO.member.email);
    const memberLink = memberMail.text.match(/https?:\/\/\S+/)![0];
    await signIn.open();
    await signIn.askForLink(DEMO.officer.email);
    await page.getByText(/a sign-in link is on its way/).waitFor();
    await newLinkMail(DEMO.officer.email);

    await signIn.open();
    await signIn.signIn(DEMO.officer.email, DEMO.officer.password);
    await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
    await page.goto(`${baseUrl}/club/mail`);
    await page.getByRole("heading", { name: "Caught mail" }).waitFor();
    const html = await page.content();
    expect(html).not.toContain(new URL(memberLink).searchParams.get("token")!);
    const memberNote = page.getByText(`[a sign-in link for ${DEMO.member.email}: only they can open it, from their own mailbox]`);
    expect(await memberNote.count()).toBeGreaterThan(0);
    const ownLinks = page.locator(`a[href*="/api/auth/callback/"][href*="${encodeURIComponent(DEMO.officer.email)}"]`);
    expect(await ownLinks.count()).toBeGreaterThan(0);
    expect(await page.locator(`a[href*="${encodeURIComponent(DEMO.member.email)}"]`).count()).toBe(0);
    // The member's link itself still works, for the member.
    const fresh = await browser().newContext(PHONE);
    const phone = await fresh.newPage();
    await phone.goto(memberLink);
    await phone.waitForURL((url) => url.pathname === "/" || url.pathname === "/signed-in");
    await fresh.close();
    await context.close();
  });
});
