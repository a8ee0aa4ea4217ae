import { describe, expect, it } from "vitest";
import golden from "./golden.json";
import { goldenInputs, keptResult } from "./golden-inputs";
import { ENGINE_VERSION } from "./index";

// The results of ENGINE_VERSION for generated inputs, kept when that version was made. A
// faster engine must give the same numbers to the last bit (JSON writes the shortest text
// that reads back as the same double); one that moves any result bumps ENGINE_VERSION, since
// every stored estimate keeps the version that made it, and regenerates the file with
// `npm run golden:update`.
describe("estimateSpecimen — unchanged within an engine version", () => {
  const inputs = goldenInputs(golden.count, golden.seed);

  it("is the version the results were kept under", () => {
    expect(ENGINE_VERSION).toBe(golden.engineVersion);
  });

  it.each(inputs.map((input, i) => [i, input] as const))("gives input %i's kept result", (i, input) => {
    expect(JSON.stringify(keptResult(input))).toBe(JSON.stringify(golden.results[i]));
  });
});
