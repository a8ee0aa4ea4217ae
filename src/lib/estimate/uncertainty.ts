import { centralPoint, QUANTITY_KEYS, type ResolvedInput } from "./input";
import { goldAlloyDensity } from "./alloy";
import { alloyInMixture, evaluateMixture, evaluateModel, weighedSpecimen, type ModelPoint, type ModelResult, type ModelSettings } from "./model";
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
  const s = r.settings;
  const box: CornerBox = {
    r,
    alloyLo: s.goldDensity ?? goldAlloyDensity(r.fineness.lo),
    alloyHi: s.goldDensity ?? goldAlloyDensity(r.fineness.hi),
    specimen: { density: 0, mass: 0 },
    alloy: [Infinity, -Infinity],
    fine: [Infinity, -Infinity],
    density: [Infinity, -Infinity],
  };
  cornersAt(box, r.tempC.lo);
  cornersAt(box, r.tempC.hi);
  // Water is densest near 3.98 °C, so below it the model runs the other way in temperature:
  // that turning point is a candidate extreme too when the span straddles it.
  if (r.tempC.lo < WATER_DENSEST_C && WATER_DENSEST_C < r.tempC.hi) cornersAt(box, WATER_DENSEST_C);
  return { alloy: box.alloy, fine: box.fine, density: box.density };
}

/** The range search's state: plain functions over it rather than closures made per call. */
type CornerBox = { r: ResolvedInput; alloyLo: number; alloyHi: number; specimen: { density: number; mass: number }; alloy: Pair; fine: Pair; density: Pair };

function cornersAt(box: CornerBox, tempC: number) {
  const rhoW = waterDensity(tempC);
  const { air, water } = box.r;
  corner(box, rhoW, air.lo, water.lo);
  corner(box, rhoW, air.lo, water.hi);
  corner(box, rhoW, air.hi, water.lo);
  corner(box, rhoW, air.hi, water.hi);
}

function corner(box: CornerBox, rhoW: number, air: number, water: number) {
  const { r, specimen } = box;
  weighedSpecimen(air, water, r.settings, rhoW, specimen);
  widen(box.density, specimen.density);
  for (let h = 0; h < 2; h++) {
    const host = h === 0 ? r.host.lo : r.host.hi;
    const alloyAtLo = alloyInMixture(specimen.mass, specimen.density, host, box.alloyLo);
    const alloyAtHi = alloyInMixture(specimen.mass, specimen.density, host, box.alloyHi);
    widen(box.alloy, alloyAtLo);
    widen(box.alloy, alloyAtHi);
    widen(box.fine, (alloyAtLo * r.fineness.lo) / 1000);
    widen(box.fine, (alloyAtHi * r.fineness.hi) / 1000);
  }
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
  const at = { centre, rhoWCentre, alloyCentre };
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
    evaluateNear(at, p, s, up);
    p[key] = xDown;
    evaluateNear(at, p, s, down);
    p[key] = centre[key];
    const cAlloy = (up.alloy - down.alloy) / (xUp - xDown);
    const cFine = (up.fine - down.fine) / (xUp - xDown);
    alloy2 += cAlloy * u * (cAlloy * u);
    fine2 += cFine * u * (cFine * u);
  }
  return { alloy: Math.sqrt(alloy2), fine: Math.sqrt(fine2) };
}

/** The model at a point one step from the centre, reusing the centre's water and alloy densities where they hold. */
function evaluateNear(at: { centre: ModelPoint; rhoWCentre: number; alloyCentre: number }, p: ModelPoint, s: ModelSettings, out: ModelResult) {
  const rhoW = p.tempC === at.centre.tempC ? at.rhoWCentre : waterDensity(p.tempC);
  const alloyDensity = p.fineness === at.centre.fineness ? at.alloyCentre : (s.goldDensity ?? goldAlloyDensity(p.fineness));
  return evaluateMixture(p, s, rhoW, alloyDensity, out);
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
