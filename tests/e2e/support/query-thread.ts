import type { Page } from "playwright-core";

/** The officer's find panel in the ledger: the query thread and the review buttons. */
export class OfficerFindPanel {
  constructor(private page: Page) {}
  get panel() {
    return this.page.getByTestId("find-panel");
  }
  get thread() {
    return this.panel.getByTestId("review-history");
  }
  async query(note: string) {
    await this.panel.getByLabel("Note to the member").fill(note);
    await this.panel.getByRole("button", { name: "Query" }).click();
    await this.thread.getByText(note).waitFor();
  }
  async verify() {
    await this.panel.getByRole("button", { name: "Verify" }).click();
    await this.thread.locator('[data-action="verify"]').waitFor();
  }
  /** The thread's steps in order: a review's action, or the step's kind. */
  async steps(): Promise<string[]> {
    return this.thread.locator("li").evaluateAll((lis) => lis.map((li) => li.getAttribute("data-action") ?? li.getAttribute("data-kind") ?? ""));
  }
}

/** A find's screen on the member's phone: the thread and the answer box. */
export class PhoneFindThread {
  constructor(private page: Page) {}
  get thread() {
    return this.page.getByTestId("query-thread");
  }
  async answer(text: string) {
    await this.thread.getByLabel("Your answer to the officer").fill(text);
    await this.thread.getByRole("button", { name: "Send answer" }).click();
    await this.thread.locator('[data-kind="answer"]').getByText(text).waitFor();
  }
  async steps(): Promise<string[]> {
    return this.thread.locator("li").evaluateAll((lis) => lis.map((li) => li.getAttribute("data-action") ?? li.getAttribute("data-kind") ?? ""));
  }
}
