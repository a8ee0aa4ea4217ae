import Database from "better-sqlite3";
import { describe, expect, inject, it } from "vitest";
import { judgeSetupCheck } from "@/lib/estimate/setup-check";
import { REFERENCE_OBJECTS } from "@/lib/estimate/reference-objects";
import { launchPersistent, PHONE, shotPath } from "./support/browser";
import { addScale, firstPage, signInToField, waitForSyncDone } from "./support/field";
import { DEMO } from "./support/pages";

const baseUrl = inject("baseUrl");

function query<T>(sql: string, ...args: unknown[]): T {
  const db = new Database(inject("databaseUrl"), { readonly: true });
  try {
    return db.prepare(sql).get(...args) as T;
  } finally {
    db.close();
  }
}

// 50 g of pure copper (8.96 g/cm³, CRC [from memory]) hangs at 44.42 g in water at 20 °C on a
// 0.01 g scale; with the basket touching the cup the in-water reading is 0.10 g heavy.
const SOUND = { air: "50.00", water: "44.42" };
const TOUCHING = { air: "50.00", water: "44.52" };
const copper = REFERENCE_OBJECTS.find((r) => r.id === "copper")!;

describe("the setup check on a member's phone (issue 16)", () => {
  it("passes a sound rig, fails a touching basket, and a weigh-in on the failed scale says so up to the server", async () => {
    const { context } = await launchPersistent(undefined, PHONE);
    const page = await firstPage(context);
    await signInToField(page, baseUrl);
    await waitForSyncDone(page);

    const card = await addScale(page, baseUrl, "Pocket scale", "0.01");
    await card.getByText(/Never checked/).waitFor();

    async function runCheck(readings: { air: string; water: string }) {
      await card.getByRole("button", { name: "Run a setup check" }).click();
      await card.getByLabel("Reference object").selectOption("copper");
      await card.locator("#air-0").fill(readings.air);
      await card.locator("#water-0").fill(readings.water);
      const verdict = card.getByTestId("check-verdict");
      await verdict.waitFor();
      return verdict;
    }

    // A sound rig: the engine's verdict, worked out here in Node, is the one shown in Chromium.
    const expected = judgeSetupCheck(
      {
        method: "hanging",
        airGrams: [50],
        waterGrams: [44.42],
        scaleResolutionGrams: 0.01,
        scaleAccuracyGrams: 0.02,
        waterTempC: 20,
        waterTempToleranceC: 2,
        airBuoyancyCorrection: true,
      },
      copper,
    );
    expect(expected.passed).toBe(true);
    let verdict = await runCheck(SOUND);
    expect(await verdict.getAttribute("data-passed")).toBe("true");
    expect(await verdict.getByRole("heading").textContent()).toBe("The rig reads true");
    expect(await verdict.getByTestId("check-measured").textContent()).toBe(expected.measuredDensity.toFixed(3));
    await page.screenshot({ path: shotPath("setup-check-passed-phone"), fullPage: true });
    await card.getByRole("button", { name: "Save this check to Pocket scale" }).click();
    await card.locator('[data-standing="passed"]').waitFor();

    // The basket touches the cup: off, and by how much.
    const failing = judgeSetupCheck(
      {
        method: "hanging",
        airGrams: [50],
        waterGrams: [44.52],
        scaleResolutionGrams: 0.01,
        scaleAccuracyGrams: 0.02,
        waterTempC: 20,
        waterTempToleranceC: 2,
        airBuoyancyCorrection: true,
      },
      copper,
    );
    expect(failing.passed).toBe(false);
    verdict = await runCheck(TOUCHING);
    expect(await verdict.getAttribute("data-passed")).toBe("false");
    expect(await verdict.getByRole("heading").textContent()).toBe("The rig is off");
    expect(await verdict.getByTestId("check-off").textContent()).toContain(`(+${failing.differencePercent.toFixed(2)} %)`);
    await page.screenshot({ path: shotPath("setup-check-failed-phone"), fullPage: true });
    await card.getByRole("button", { name: "Save this check to Pocket scale" }).click();
    await card.locator('[data-standing="failed"]').waitFor();
    await card.getByText("Setup checks (2)").click();
    expect(
      await card
        .getByTestId("check-history")
        .locator("li")
        .evaluateAll((els) => els.map((e) => e.getAttribute("data-passed"))),
    ).toEqual(["false", "true"]);

    // A weigh-in on that scale: the flow says the check failed, the find keeps it, the club learns it.
    const find = query<{ id: string }>(
      "select f.id from finds f join members m on m.id = f.member_id where m.email = ? and f.kind = 'specimen' and f.deleted_at is null and f.weight_grams > 20 order by f.found_at desc limit 1",
      DEMO.member.email,
    );
    await page.goto(`${baseUrl}/finds/view#id=${find.id}`);
    await page.getByRole("button", { name: "Weigh this specimen" }).click();
    // The scale list: the one select that offers the member's scales.
    await page
      .getByRole("combobox")
      .filter({ has: page.getByRole("option", { name: "Pocket scale — step 0.01 g" }) })
      .selectOption({ label: "Pocket scale — step 0.01 g" });
    await page.getByTestId("scale-check-failed").waitFor();
    await page.locator("#air-0").fill("100.00");
    await page.locator("#water-0").fill("62.72");
    await page.getByTestId("fine-gold").waitFor();
    await page.getByRole("button", { name: "Save this weigh-in to the find" }).click();
    await page.locator('[data-testid="weigh-in-scale"][data-standing="failed"]').first().waitFor();
    await page.screenshot({ path: shotPath("weigh-in-on-failed-scale-phone"), fullPage: true });
    // Saving asked for camp sync; the server's own verdict lands on the find.
    await expect
      .poll(() => query<{ c: number | null } | undefined>("select weighed_scale_checked c from finds where id = ?", find.id)?.c, { timeout: 30_000 })
      .toBe(0);
    const scale = query<{ passed: number; checks: string }>("select latest_check_passed passed, checks from scales where name = 'Pocket scale'");
    expect(scale.passed).toBe(0);
    expect(JSON.parse(scale.checks)).toHaveLength(2);
    await context.close();
  });
});
