import { centralPoint, QUANTITY_KEYS, type ResolvedInput } from "./input";
import { goldAlloyDensity } from "./alloy";
import { alloyInMixture, evaluateMixture, evaluateModel, weighedSpecimen, type ModelPoint, type ModelResult } from "./model";
import { WATER_DENSEST_C, WATER_TEMP_MAX_C, WATER_TEMP_MIN_C, waterDensity } from "./water";

type Pair = [number, number];

const DOMAIN: Record<keyof ModelPoint, Pair> = {
  air: [-Infinity, Infinity],
  water: [-Infinity, Infinity],
  tempC: [WATER_TEMP_MIN_C, WATER_TEMP_MAX_C],
  host: [-Infinity, Infinity],
  fineness: [Number.MIN_VALUE, 1000],
};

/**
 * Min and max over every corner of the input box: the model is monotonic in each input.
 * The specimen's density depends on the readings and the water only, so it is worked out once
 * for each of those corners and the host and fineness corners reuse it (the same arithmetic
 * on the same values as evaluateModel, so the same bits).
 */
export function cornerRange(r: ResolvedInput): { alloy: Pair; fine: Pair; density: Pair } {
  const alloy: Pair = [Infinity, -Infinity];
  const fine: Pair = [Infinity, -Infinity];
  const density: Pair = [Infinity, -Infinity];
  const s = r.settings;
  const fineLo = r.fineness.lo;
  const fineHi = r.fineness.hi;
  const alloyLo = s.goldDensity ?? goldAlloyDensity(fineLo);
  const alloyHi = s.goldDensity ?? goldAlloyDensity(fineHi);
  const specimen = { density: 0, mass: 0 };
  const corner = (rhoW: number, air: number, water: number) => {
    weighedSpecimen(air, water, s, rhoW, specimen);
    widen(density, specimen.density);
    for (let h = 0; h < 2; h++) {
      const host = h === 0 ? r.host.lo : r.host.hi;
      const alloyAtLo = alloyInMixture(specimen.mass, specimen.density, host, alloyLo);
      const alloyAtHi = alloyInMixture(specimen.mass, specimen.density, host, alloyHi);
      widen(alloy, alloyAtLo);
      widen(alloy, alloyAtHi);
      widen(fine, (alloyAtLo * fineLo) / 1000);
      widen(fine, (alloyAtHi * fineHi) / 1000);
    }
  };
  const at = (tempC: number) => {
    const rhoW = waterDensity(tempC);
    corner(rhoW, r.air.lo, r.water.lo);
    corner(rhoW, r.air.lo, r.water.hi);
    corner(rhoW, r.air.hi, r.water.lo);
    corner(rhoW, r.air.hi, r.water.hi);
  };
  at(r.tempC.lo);
  at(r.tempC.hi);
  // Water is densest near 3.98 °C, so below it the model runs the other way in temperature:
  // that turning point is a candidate extreme too when the span straddles it.
  if (r.tempC.lo < WATER_DENSEST_C && WATER_DENSEST_C < r.tempC.hi) at(WATER_DENSEST_C);
  return { alloy, fine, density };
}

function widen(pair: Pair, v: number) {
  if (v < pair[0]) pair[0] = v;
  if (v > pair[1]) pair[1] = v;
}

/**
 * Combined standard uncertainty by linear propagation (JCGM 100:2008, GUM, eq. 10), inputs
 * taken as uncorrelated; sensitivity coefficients by central differences. The water and alloy
 * densities at the centre are worked out once; only a step in temperature or fineness moves them.
 */
export function gumUncertainty(r: ResolvedInput): { alloy: number; fine: number } {
  const centre = centralPoint(r);
  const s = r.settings;
  const rhoWCentre = waterDensity(centre.tempC);
  const alloyCentre = s.goldDensity ?? goldAlloyDensity(centre.fineness);
  const up: ModelResult = { density: 0, volume: 0, mass: 0, alloyDensity: 0, alloy: 0, fine: 0 };
  const down: ModelResult = { ...up };
  const at = (p: ModelPoint, out: ModelResult) =>
    evaluateMixture(p, s, p.tempC === centre.tempC ? rhoWCentre : waterDensity(p.tempC), p.fineness === centre.fineness ? alloyCentre : (s.goldDensity ?? goldAlloyDensity(p.fineness)), out);
  let alloy2 = 0;
  let fine2 = 0;
  const p = { ...centre };
  for (const key of QUANTITY_KEYS) {
    const u = r[key].u;
    if (u === 0) continue;
    const h = u / 1000;
    // One-sided at the edge of the model's domain (fineness 1000 ‰, 0 or 40 °C).
    const [min, max] = DOMAIN[key];
    const xUp = Math.min(centre[key] + h, max);
    const xDown = Math.max(centre[key] - h, min);
    p[key] = xUp;
    at(p, up);
    p[key] = xDown;
    at(p, down);
    p[key] = centre[key];
    const cAlloy = (up.alloy - down.alloy) / (xUp - xDown);
    const cFine = (up.fine - down.fine) / (xUp - xDown);
    alloy2 += cAlloy * u * (cAlloy * u);
    fine2 += cFine * u * (cFine * u);
  }
  return { alloy: Math.sqrt(alloy2), fine: Math.sqrt(fine2) };
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

export type MonteCarloResult = {
  samples: number;
  alloy: { mean: number; sd: number; p025: number; p975: number };
  fine: { mean: number; sd: number; p025: number; p975: number };
};

/**
 * Propagation of distributions (JCGM 101:2008): each input drawn from the distribution its
 * standard uncertainty stands for — rectangular over its box (readings: one scale step,
 * widened by an approximately normal type A term from 12 uniforms).
 */
export function monteCarlo(r: ResolvedInput, samples = 10000, seed = 1): MonteCarloResult {
  const rand = seededRandom(seed);
  const centre = centralPoint(r);
  const alloys = new Float64Array(samples);
  const fines = new Float64Array(samples);
  const typeA = (q: { u: number }, resolution: number) => Math.sqrt(Math.max(0, q.u * q.u - (resolution * resolution) / 12));
  const aAir = typeA(r.air, r.resolution);
  const aWater = typeA(r.water, r.resolution);
  const normal = () => {
    let s = -6;
    for (let i = 0; i < 12; i++) s += rand();
    return s;
  };
  const uniform = (lo: number, hi: number) => lo + (hi - lo) * rand();
  // A reading with no type A part (one reading) draws no normal term: same distribution, and
  // a cold run on a slow phone stays short.
  const typeAAir = aAir > 0 ? () => aAir * normal() : () => 0;
  const typeAWater = aWater > 0 ? () => aWater * normal() : () => 0;
  const p: ModelPoint = { air: 0, water: 0, tempC: 0, host: 0, fineness: 0 };
  const m = { density: 0, volume: 0, mass: 0, alloyDensity: 0, alloy: 0, fine: 0 };
  for (let i = 0; i < samples; i++) {
    p.air = centre.air + (rand() - 0.5) * r.resolution + typeAAir();
    p.water = centre.water + (rand() - 0.5) * r.resolution + typeAWater();
    p.tempC = uniform(r.tempC.lo, r.tempC.hi);
    p.host = uniform(r.host.lo, r.host.hi);
    p.fineness = uniform(r.fineness.lo, r.fineness.hi);
    evaluateModel(p, r.settings, m);
    alloys[i] = m.alloy;
    fines[i] = m.fine;
  }
  return { samples, alloy: summarise(alloys), fine: summarise(fines) };
}

function summarise(values: Float64Array) {
  const n = values.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i];
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (values[i] - mean) * (values[i] - mean);
  const sorted = values.slice().sort();
  return { mean, sd: Math.sqrt(ss / (n - 1)), p025: sorted[Math.floor(0.025 * (n - 1))], p975: sorted[Math.ceil(0.975 * (n - 1))] };
}
