import { goldAlloyDensity } from "./alloy";
import type { WeighMethod } from "./types";
import { waterDensity } from "./water";

/** OIML D 28: conventional weighing in air at 1.2 kg/m³ against reference weights of 8000 kg/m³. */
export const AIR_DENSITY = 0.0012;
export const REFERENCE_WEIGHT_DENSITY = 8.0;

/** One point of the input space: every uncertain quantity fixed to a value. */
export type ModelPoint = {
  air: number; // mean air reading, g
  water: number; // mean water reading as the method gives it, g
  tempC: number;
  host: number; // host rock density, g/cm³
  fineness: number; // ‰
};

export type ModelSettings = { method: WeighMethod; goldDensity?: number; airCorrection: boolean };

export type ModelResult = {
  density: number;
  volume: number;
  mass: number;
  alloyDensity: number;
  alloy: number;
  fine: number;
};

/** Mass of water pushed aside: the hanging loss of weight, or the buoyancy reading itself. */
export function displacedGrams(method: WeighMethod, air: number, water: number): number {
  return method === "hanging" ? air - water : water;
}

/**
 * The two-component mixture (the classical hydrostatic rule for a compound of two
 * substances whose volumes add): m_g = m·ρg·(ρs − ρh) / (ρs·(ρg − ρh)), clamped to
 * [0, m] so that a reading outside the two densities gives "none" or "all of it".
 */
export function evaluateModel(p: ModelPoint, s: ModelSettings, out?: ModelResult): ModelResult {
  return evaluateMixture(p, s, waterDensity(p.tempC), s.goldDensity ?? goldAlloyDensity(p.fineness), out);
}

/** The model with water and alloy densities given (the range search computes each once per corner set). */
export function evaluateMixture(p: Omit<ModelPoint, "tempC">, s: ModelSettings, rhoW: number, alloyDensity: number, out?: ModelResult): ModelResult {
  const specimen = weighedSpecimen(p.air, p.water, s, rhoW, SCRATCH);
  const density = specimen.density;
  const mass = specimen.mass;
  const alloy = alloyInMixture(mass, density, p.host, alloyDensity);
  const fine = (alloy * p.fineness) / 1000;
  // `out`: the range search and Monte Carlo reuse one result object (no allocation per point).
  if (!out) return { density, volume: mass / density, mass, alloyDensity, alloy, fine };
  out.density = density;
  out.volume = mass / density;
  out.mass = mass;
  out.alloyDensity = alloyDensity;
  out.alloy = alloy;
  out.fine = fine;
  return out;
}

const SCRATCH = { density: 0, mass: 0 };

/** The specimen's density and true mass from its two readings (the first half of the model). */
export function weighedSpecimen(air: number, water: number, s: ModelSettings, rhoW: number, out: { density: number; mass: number }) {
  const displaced = displacedGrams(s.method, air, water);
  if (s.airCorrection) {
    // Density-kit form with air buoyancy: ρs = A·(ρw − ρa)/(A − B) + ρa; true mass from the
    // conventional value (OIML D 28): m = A·(1 − ρa/ρref)/(1 − ρa/ρs).
    out.density = displaced > 0 ? (air * (rhoW - AIR_DENSITY)) / displaced + AIR_DENSITY : Infinity;
    out.mass = (air * (1 - AIR_DENSITY / REFERENCE_WEIGHT_DENSITY)) / (1 - AIR_DENSITY / out.density);
  } else {
    out.density = displaced > 0 ? (air * rhoW) / displaced : Infinity;
    out.mass = air;
  }
  return out;
}

/** Mass of gold alloy in the two-component mixture, clamped to [0, mass] (the second half). */
export function alloyInMixture(mass: number, density: number, host: number, alloyDensity: number): number {
  if (density <= host) return 0;
  if (density >= alloyDensity) return mass;
  return (mass * alloyDensity * (density - host)) / (density * (alloyDensity - host));
}
