import { EstimateInputError } from "./errors";
import { estimateSpecimen } from "./index";
import type { SpecimenInput } from "./types";
import { seededRandom } from "./uncertainty";
import { ENGINE_VERSION } from "./version";

/**
 * Generated specimen inputs over every option of the engine (methods, repeats, scale steps
 * and accuracies, temperatures across water's densest point, host and fineness ranges, some
 * off their centre, an alloy density, the air-buoyancy option), some of them refused. Their
 * results under ENGINE_VERSION are kept in golden.json; a change that moves any of them must
 * bump the version and regenerate the file (`npm run golden:update`).
 */
export function goldenInputs(count: number, seed = 7): SpecimenInput[] {
  const rand = seededRandom(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)];
  const round = (x: number, step: number) => Math.round(x / step) * step;
  const inputs: SpecimenInput[] = [];
  for (let i = 0; i < count; i++) {
    const method = pick(["hanging", "buoyancy"] as const);
    const resolution = pick([0.001, 0.01, 0.01, 0.1, 1]);
    const air = round(1 + rand() * 400, resolution);
    // Specimen densities from below quartz to above pure gold, so every clamp and refusal shows.
    const density = i % 40 === 39 ? 19.2 + rand() : 2.2 + rand() * rand() * 18;
    const displaced = air / density;
    const reading = method === "hanging" ? air - displaced : displaced;
    const repeats = (centre: number) => Array.from({ length: 1 + Math.floor(rand() * 4) }, () => round(centre + (rand() - 0.5) * 4 * resolution, resolution));
    const input: SpecimenInput = { method, airGrams: repeats(air), waterGrams: repeats(reading), scaleResolutionGrams: resolution };
    if (rand() < 0.3) input.scaleAccuracyGrams = resolution * pick([0.5, 1, 3]);
    if (rand() < 0.7) input.waterTempC = round(rand() * 40, 0.5);
    if (rand() < 0.5) input.waterTempToleranceC = pick([0, 0.5, 2, 5]);
    if (rand() < 0.6) input.hostDensity = pick([2.6, 2.65, 2.72, 2.9, 3.3]);
    if (input.hostDensity && rand() < 0.5) input.hostDensityRange = [input.hostDensity - 0.05, input.hostDensity + pick([0.05, 0.05, 0.2])];
    if (rand() < 0.4) input.goldDensity = pick([15.5, 17.5, 19.32]);
    else if (rand() < 0.7) input.finenessPermille = pick([700, 800, 850, 900, 1000]);
    if (input.finenessPermille && rand() < 0.6) {
      const half = Math.min(pick([50, 100]), 1000 - input.finenessPermille);
      input.finenessRangePermille = [input.finenessPermille - half, input.finenessPermille + pick([half, half, 0])];
    }
    if (rand() < 0.25) input.airBuoyancyCorrection = false;
    inputs.push(input);
  }
  return inputs;
}

/** What is kept for one input: the estimate, or the refusal's code and field. */
export function keptResult(input: SpecimenInput): unknown {
  try {
    return estimateSpecimen(input);
  } catch (error) {
    if (!(error instanceof EstimateInputError)) throw error;
    return { refused: error.code, field: error.field };
  }
}

export type GoldenFile = { engineVersion: string; count: number; seed: number; results: unknown[] };

/** The kept results as written to golden.json: one result per line, so a change reads in a diff. */
export function goldenFileText(count: number, seed: number): string {
  const results = goldenInputs(count, seed).map(keptResult);
  const head = JSON.stringify({ engineVersion: ENGINE_VERSION, count, seed });
  return `${head.slice(0, -1)},"results":[\n${results.map((r) => JSON.stringify(r)).join(",\n")}\n]}\n`;
}
