import { centralPoint, QUANTITY_KEYS, type ResolvedInput } from "./input";
import { evaluateModel, type ModelPoint, type ModelSettings } from "./model";
import { WATER_TEMP_MAX_C, WATER_TEMP_MIN_C } from "./water";

type Pair = [number, number];

const DOMAIN: Record<keyof ModelPoint, Pair> = {
  air: [-Infinity, Infinity],
  water: [-Infinity, Infinity],
  tempC: [WATER_TEMP_MIN_C, WATER_TEMP_MAX_C],
  host: [-Infinity, Infinity],
  fineness: [Number.MIN_VALUE, 1000],
};

export type Uncertainty = {
  alloy: number;
  fine: number;
  /** The part of the alloy's uncertainty that comes from the scale (step and accuracy), not the repeats. */
  scaleAlloy: number;
};

/** The mixture formula and its fine gold, before they are held to [0, mass]. */
function formulaAt(p: ModelPoint, s: ModelSettings): { alloy: number; fine: number } {
  const m = evaluateModel(p, s);
  return { alloy: m.uncapped, fine: (m.uncapped * p.fineness) / 1000 };
}

/**
 * Combined standard uncertainty by linear propagation (JCGM 100:2008, GUM, eq. 10), inputs
 * taken as uncorrelated; sensitivity coefficients by central differences of the mixture
 * formula as it stands. Held to [0, mass] its slope would be zero at "no gold", and the
 * uncertainty with it, while the readings still allow some gold: the formula's slope says how
 * much they allow.
 */
export function gumUncertainty(r: ResolvedInput): Uncertainty {
  const centre = centralPoint(r);
  let alloy2 = 0;
  let fine2 = 0;
  let scale2 = 0;
  for (const key of QUANTITY_KEYS) {
    const u = r[key].u;
    if (u === 0) continue;
    const h = u / 1000;
    // One-sided at the edge of the model's domain (fineness 1000 ‰, 0 or 40 °C).
    const [min, max] = DOMAIN[key];
    const xUp = Math.min(centre[key] + h, max);
    const xDown = Math.max(centre[key] - h, min);
    const up = formulaAt({ ...centre, [key]: xUp }, r.settings);
    const down = formulaAt({ ...centre, [key]: xDown }, r.settings);
    const cAlloy = (up.alloy - down.alloy) / (xUp - xDown);
    const cFine = (up.fine - down.fine) / (xUp - xDown);
    alloy2 += cAlloy * u * (cAlloy * u);
    fine2 += cFine * u * (cFine * u);
    if (key === "air" || key === "water") scale2 += cAlloy * r[key].uScale * (cAlloy * r[key].uScale);
  }
  return { alloy: Math.sqrt(alloy2), fine: Math.sqrt(fine2), scaleAlloy: Math.sqrt(scale2) };
}

/** Small, fast, seedable generator (mulberry32); the same seed gives the same stream anywhere. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type Summary = { mean: number; sd: number; p025: number; p975: number };
export type MonteCarloResult = { samples: number; alloy: Summary; fine: Summary };

/**
 * Propagation of distributions (JCGM 101:2008) through the same mixture formula the standard
 * uncertainty linearises (before it is held to [0, mass]): each input drawn from the
 * distribution its standard uncertainty stands for, rectangular over its range (readings:
 * ± the scale's bound, widened by an approximately normal type A term from 12 uniforms).
 */
export function monteCarlo(r: ResolvedInput, samples = 10000, seed = 1): MonteCarloResult {
  const rand = seededRandom(seed);
  const centre = centralPoint(r);
  const alloys = new Float64Array(samples);
  const fines = new Float64Array(samples);
  const normal = () => {
    let s = -6;
    for (let i = 0; i < 12; i++) s += rand();
    return s;
  };
  const uniform = (lo: number, hi: number) => lo + (hi - lo) * rand();
  // A reading with no type A part (one reading) draws no normal term: same distribution, and
  // a cold run on a slow phone stays short.
  const repeatTerm = (uRepeat: number) => (uRepeat > 0 ? uRepeat * normal() : 0);
  for (let i = 0; i < samples; i++) {
    const p: ModelPoint = {
      air: centre.air + (2 * rand() - 1) * r.air.bound + repeatTerm(r.air.uRepeat),
      water: centre.water + (2 * rand() - 1) * r.water.bound + repeatTerm(r.water.uRepeat),
      tempC: uniform(r.tempC.lo, r.tempC.hi),
      host: uniform(r.host.lo, r.host.hi),
      fineness: uniform(r.fineness.lo, r.fineness.hi),
    };
    const f = formulaAt(p, r.settings);
    alloys[i] = f.alloy;
    fines[i] = f.fine;
  }
  return { samples, alloy: summarise(alloys), fine: summarise(fines) };
}

function summarise(values: Float64Array): Summary {
  const n = values.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i];
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (values[i] - mean) * (values[i] - mean);
  const sorted = values.slice().sort();
  return { mean, sd: Math.sqrt(ss / (n - 1)), p025: sorted[Math.floor(0.025 * (n - 1))], p975: sorted[Math.ceil(0.975 * (n - 1))] };
}
