// @vitest-environment jsdom
import { cleanup, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { estimateSpecimen } from "@/lib/estimate";
import { formatGrams } from "@/lib/format";
import { EstimatePanel } from "./estimate-panel";

afterEach(cleanup);

describe("the estimate panel", () => {
  // 100.00 g in air, 62.72 g hung in water, clean quartz, natural gold: ± several tenths of a gram.
  const estimate = estimateSpecimen({
    method: "hanging",
    airGrams: [100],
    waterGrams: [62.72],
    hostDensity: 2.65,
    hostDensityRange: [2.62, 2.68],
    finenessPermille: 825,
    finenessRangePermille: [700, 950],
  });

  it("shows figures to the precision their ± allows, the range as the worst case, and no s.u.", () => {
    expect(estimate.standardUncertainty.fineGoldGrams).toBeGreaterThan(0.1);
    render(<EstimatePanel estimate={estimate} unit="g" onUnitChange={() => {}} />);
    const fine = screen.getByTestId("fine-gold").textContent!;
    expect(fine).toBe(formatGrams(estimate.fineGoldGrams, "g", estimate.standardUncertainty.fineGoldGrams));
    expect(fine).toMatch(/^\d+\.\d g$/);
    const range = screen.getByTestId("fine-range").textContent!;
    expect(range).toMatch(/^± \d+\.\d g · at worst \d+\.\d g – \d+\.\d g$/);
    expect(document.body.textContent).not.toMatch(/s\.u\./);
    expect(document.body.textContent).toMatch(/all at their\s+worst at once/);
  });

  it("gives no ± around a figure held at no gold, and says why", () => {
    // 100.00 g in air, 62.20 g in water: 2.64 g/cm³, within quartz's 2.62–2.68, held at 0.
    const held = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [62.2], hostDensity: 2.65, hostDensityRange: [2.62, 2.68] });
    expect(held.goldAlloyGrams).toBe(0);
    render(<EstimatePanel estimate={held} unit="g" onUnitChange={() => {}} />);
    expect(screen.getByTestId("fine-range").textContent).toMatch(/^at worst 0\.\d+ g – \d+\.\d+ g$/);
    expect(screen.getByTestId("spread-explained").textContent).toMatch(/^No ± here: the figure is held at no gold/);
    expect(document.body.textContent).not.toMatch(/± [\d.]+ g · at worst/);
  });

  it("words every warning from its code and numbers", () => {
    const clamped = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [60.85] });
    render(<EstimatePanel estimate={clamped} unit="g" onUnitChange={() => {}} />);
    const items = screen.getByTestId("warnings").querySelectorAll("li");
    expect([...items].map((li) => li.dataset.code)).toContain("lighter_than_host");
    expect(screen.getByTestId("warnings").textContent).toMatch(/host assumption is probably wrong/);
  });
});
