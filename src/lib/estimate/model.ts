import { goldAlloyDensity } from "./alloy";
import type { WeighMethod } from "./types";
import { waterDensity } from "./water";

/** OIML D 28: conventional weighing in air at 1.2 kg/m³ against reference weights of 8000 kg/m³. */
export const AIR_DENSITY = 0.0012;
export const REFERENCE_WEIGHT_DENSITY = 8.0;
/** A scale adjusted with those weights shows m_c = (m − ρa·V) / (1 − ρa/ρref) (OIML D 28). */
const CONVENTIONAL = 1 - AIR_DENSITY / REFERENCE_WEIGHT_DENSITY;

/** One point of the input space: every uncertain quantity fixed to a value. */
export type ModelPoint = {
  air: number; // mean air reading, g
  water: number; // mean water reading as the method gives it, g
  tempC: number;
  host: number; // host rock density, g/cm³
  fineness: number; // ‰
};

export type ModelSettings = { method: WeighMethod; goldDensity?: number; airCorrection: boolean };

/** The specimen as weighed: true mass (g), volume (cm³) and density (g/cm³). */
export type Weighed = { mass: number; volume: number; density: number };

export type ModelResult = Weighed & {
  alloyDensity: number;
  /** The mixture formula as it stands: below 0 means lighter than the host, above mass denser than the alloy. */
  uncapped: number;
  /** Gold alloy held to [0, mass]. */
  alloy: number;
  /** Fine gold in the held alloy. */
  fine: number;
};

/** Mass of water pushed aside: the hanging loss of weight, or the buoyancy reading itself. */
export function displacedGrams(method: WeighMethod, air: number, water: number): number {
  return method === "hanging" ? air - water : water;
}

/**
 * The specimen's true volume, mass and density from its two readings. With the air's
 * buoyancy (OIML D 28): the hanging loss of weight, or the vessel's gain, is
 * (ρw − ρa)·V in conventional grams times (1 − ρa/ρref), and the dry reading is
 * (m − ρa·V) likewise; without it, the textbook V = displaced/ρw and m = the dry reading.
 */
export function weighSpecimen(air: number, water: number, s: ModelSettings, rhoW: number): Weighed {
  const displaced = displacedGrams(s.method, air, water);
  if (!s.airCorrection) {
    const volume = displaced / rhoW;
    return { mass: air, volume, density: volume > 0 ? air / volume : Infinity };
  }
  const volume = (CONVENTIONAL * displaced) / (rhoW - AIR_DENSITY);
  const mass = CONVENTIONAL * air + AIR_DENSITY * volume;
  return { mass, volume, density: volume > 0 ? mass / volume : Infinity };
}

/**
 * The two-component mixture (the classical hydrostatic rule for a compound of two substances
 * whose volumes add): m_g = m·ρg·(ρs − ρh) / (ρs·(ρg − ρh)), written as ρg·(m − ρh·V)/(ρg − ρh),
 * which is linear in the readings. Not held to [0, m]: the range search and the uncertainty
 * need it as it stands.
 */
export function mixtureAlloy(w: Weighed, host: number, alloyDensity: number): number {
  return (alloyDensity * (w.mass - host * w.volume)) / (alloyDensity - host);
}

/** Gold below this share of the specimen is rounding noise in the formula, and counted as none. */
export const NOISE = 1e-9;

/** The alloy held to what a specimen can hold: none, or all of it. */
export function holdToSpecimen(alloy: number, mass: number): number {
  if (alloy <= NOISE * mass) return 0;
  if (alloy > mass) return mass;
  return alloy;
}

/** The model at one point of the input space. */
export function evaluateModel(p: ModelPoint, s: ModelSettings): ModelResult {
  const w = weighSpecimen(p.air, p.water, s, waterDensity(p.tempC));
  const alloyDensity = s.goldDensity ?? goldAlloyDensity(p.fineness);
  const uncapped = mixtureAlloy(w, p.host, alloyDensity);
  const alloy = holdToSpecimen(uncapped, w.mass);
  return { mass: w.mass, volume: w.volume, density: w.density, alloyDensity, uncapped, alloy, fine: (alloy * p.fineness) / 1000 };
}
