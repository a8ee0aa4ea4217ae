import type { Page } from "playwright-core";

/** The weigh-in flow, driven through its labels as a prospector would. */
export class WeighPage {
  constructor(
    private page: Page,
    private baseUrl: string,
  ) {}
  async open() {
    await this.page.goto(`${this.baseUrl}/weigh`);
    await this.page.getByRole("heading", { name: "Weigh a specimen" }).waitFor();
  }
  async method(name: "Hung from the scale" | "Vessel on the scale") {
    await this.page.getByLabel(name).check();
  }
  async readings(air: string[], water: string[]) {
    for (const [list, name] of [
      [air, "Dry, in air"],
      [water, /Hung under water|Vessel reading/],
    ] as const) {
      const group = this.page.getByRole("group", { name });
      // The flow starts with three rows for repeats; more are added as needed.
      for (let i = 0; i < list.length; i++) {
        if (i >= (await group.getByRole("textbox").count())) await group.getByRole("button", { name: "Add a repeat reading" }).click();
        await group.getByRole("textbox").nth(i).fill(list[i]);
      }
    }
  }
  async host(label: string) {
    await this.page.getByLabel("Host rock").selectOption({ label });
  }
  async temperature(value: string) {
    await this.page.getByLabel("Water temperature").fill(value);
  }
  text(testId: string) {
    return this.page.getByTestId("estimate").getByTestId(testId).textContent();
  }
  warnings() {
    return this.page
      .getByTestId("warnings")
      .locator("li")
      .evaluateAll((els) => els.map((e) => e.getAttribute("data-code")));
  }
}
