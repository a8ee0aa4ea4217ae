import fs from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";

export const DEMO = {
  officer: { email: "marguerite@quillmarsh.example", password: "officer-demo-pass", firstName: "Marguerite" },
  member: { email: "ines@quillmarsh.example", password: "member-demo-pass", firstName: "Ines" },
};

/** The sign-in page, found by its labels and roles as a member would. */
export class SignInPage {
  constructor(
    private page: Page,
    private baseUrl: string,
  ) {}
  async open() {
    await this.page.goto(`${this.baseUrl}/sign-in`);
  }
  async signIn(email: string, password: string) {
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByLabel("Password").fill(password);
    await this.page.getByRole("button", { name: "Sign in", exact: true }).click();
  }
  async askForLink(email: string) {
    await this.page.getByRole("button", { name: "E-mail me a link instead" }).click();
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
  }
}

/** Waits for the mail catcher to hold a message to `to`, and returns its text. */
export async function waitForMail(mailDir: string, to: string, timeoutMs = 15_000): Promise<{ subject: string; text: string }> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const files = fs.existsSync(mailDir)
      ? fs
          .readdirSync(mailDir)
          .filter((f) => f.endsWith(".json"))
          .sort()
          .reverse()
      : [];
    for (const f of files) {
      const m = JSON.parse(fs.readFileSync(path.join(mailDir, f), "utf8"));
      if (m.to.includes(to)) return m;
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
}
