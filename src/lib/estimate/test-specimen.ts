import { goldAlloyDensity } from "./alloy";
import { waterDensity } from "./water";

// OIML D 28: a scale adjusted with reference weights of 8000 kg/m³ in air of 1.2 kg/m³ shows
// the conventional value m_c = (m − ρa·V) / (1 − ρa/ρref). Typed here from the
// Recommendation rather than imported from the engine, so the tests check the engine's own.
const AIR = 0.0012;
const REFERENCE_WEIGHTS = 8.0;

/**
 * Readings a perfect scale would show for a specimen composed of known masses of gold alloy
 * and host rock whose volumes add (test helper, not part of the engine). By default the
 * readings are what a real scale shows in air (OIML D 28 conventional values); `air: false`
 * gives the textbook readings of a weighing in vacuum.
 */
export function composeSpecimen(opts: { goldGrams: number; fineness: number; hostGrams: number; hostDensity: number; tempC?: number; air?: boolean }) {
  const rhoW = waterDensity(opts.tempC ?? 20);
  const volume = opts.goldGrams / goldAlloyDensity(opts.fineness) + opts.hostGrams / opts.hostDensity;
  const mass = opts.goldGrams + opts.hostGrams;
  const rhoA = opts.air === false ? 0 : AIR;
  const k = opts.air === false ? 1 : 1 - AIR / REFERENCE_WEIGHTS;
  return {
    mass,
    volume,
    /** The dry specimen on the scale. */
    air: (mass - rhoA * volume) / k,
    /** Hanging under water from the tared line. */
    hangingWater: (mass - rhoW * volume) / k,
    /** The tared vessel with the specimen hung inside: its water rises into the air above it. */
    buoyancyReading: ((rhoW - rhoA) * volume) / k,
  };
}

/** A reading as a scale of the given step shows it. */
export function roundToStep(grams: number, step: number): number {
  // toPrecision drops the binary noise of the product (29.490000000000002 → 29.49), as a display does.
  return Number((Math.round(grams / step) * step).toPrecision(12));
}
