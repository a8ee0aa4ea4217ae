// @vitest-environment jsdom
import { act, cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { judgeSetupCheck } from "@/lib/estimate/setup-check";
import { SetupCheckFlow } from "./setup-check-flow";

afterEach(cleanup);

async function type(id: string, value: string) {
  await act(async () => {
    fireEvent.input(document.getElementById(id)!, { target: { value } });
  });
}

const scale = { id: "0190f1a2-0000-7000-8000-000000000001", name: "Pocket scale", stepGrams: 0.01, accuracyGrams: null, checks: [] };

describe("the setup-check flow", () => {
  it("shows the engine's verdict and how far off, and saves the check with it", async () => {
    const onSave = vi.fn();
    render(<SetupCheckFlow scale={scale} onSave={onSave} />);
    // 50 g of copper hung at 44.52 g: the basket touching the cup (setup-check.test.ts works it by hand).
    await type("air-0", "50.00");
    await type("water-0", "44.52");
    const verdict = await screen.findByTestId("check-verdict");
    const expected = judgeSetupCheck(
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
      { density: 8.96, uncertainty: 0.02 },
    );
    expect(verdict.dataset.passed).toBe("false");
    expect(screen.getByTestId("check-off").textContent).toContain(`(+${expected.differencePercent.toFixed(2)} %)`);
    await act(async () => {
      fireEvent.click(screen.getByRole("button", { name: "Save this check to Pocket scale" }));
    });
    expect(onSave).toHaveBeenCalledTimes(1);
    const saved = onSave.mock.calls[0][0];
    expect(saved.reference).toMatchObject({ kind: "copper", density: 8.96, uncertainty: 0.02 });
    expect(saved.result).toEqual(expected);
  });

  it("takes the member's own object, measured once", async () => {
    render(<SetupCheckFlow scale={scale} onSave={() => {}} />);
    await act(async () => {
      fireEvent.change(screen.getByLabelText("Reference object"), { target: { value: "own" } });
    });
    await type("air-0", "50.00");
    await type("water-0", "44.42");
    expect(screen.getByTestId("check-waiting")).toBeTruthy();
    await act(async () => {
      fireEvent.input(screen.getByLabelText("Its density g/cm³"), { target: { value: "8.96" } });
      fireEvent.input(screen.getByLabelText("± (one standard uncertainty)"), { target: { value: "0.02" } });
    });
    expect((await screen.findByTestId("check-verdict")).dataset.passed).toBe("true");
  });
});
