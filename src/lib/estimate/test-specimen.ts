import { goldAlloyDensity } from "./alloy";
import { waterDensity } from "./water";

/**
 * Readings a perfect scale would show for a specimen composed of known masses of gold alloy
 * and host rock whose volumes add (test helper, not part of the engine).
 */
export function composeSpecimen(opts: { goldGrams: number; fineness: number; hostGrams: number; hostDensity: number; tempC?: number }) {
  const rhoW = waterDensity(opts.tempC ?? 20);
  const volume = opts.goldGrams / goldAlloyDensity(opts.fineness) + opts.hostGrams / opts.hostDensity;
  const air = opts.goldGrams + opts.hostGrams;
  const displaced = volume * rhoW;
  return { air, hangingWater: air - displaced, buoyancyReading: displaced };
}
