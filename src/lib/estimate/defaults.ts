// The estimate's defaults and limits, apart from the engine: forms and the scale list read
// them without loading the estimate itself.
import { FINENESS_PRESETS } from "./presets";

const NATURAL = FINENESS_PRESETS.find((p) => p.id === "natural")!;

export const DEFAULTS = {
  scaleResolutionGrams: 0.01,
  waterTempC: 20,
  waterTempToleranceC: 2,
  hostDensity: 2.65,
  /** Default host span: ±2 % around the chosen density (our choice; quartz with a little
   *  iron oxide or mica spans about this much, Holland & Powell ds62 quartz 2.648). */
  hostRelativeSpan: 0.02,
  /** With no fineness given, natural gold of unknown fineness (the "natural" preset, and its
   *  sources): pure gold would flatter every specimen whose gold is an alloy, as natural gold is. */
  finenessPermille: NATURAL.fineness,
  finenessRangePermille: NATURAL.range,
} as const;

/** The heaviest reading taken as a specimen weighing (a 100 kg scale); beyond it, a typing slip. */
export const MAX_READING_GRAMS = 100_000;
/** The coarsest scale step and accuracy accepted. */
export const MAX_STEP_GRAMS = 10;

/**
 * The accuracy assumed when the member does not state their scale's: how far one reading may
 * be off, rounding included. From pocket-scale specifications as commonly printed [memory, not
 * confirmed in a source]: milligram scales ±3 steps (drafts and static tell at that step),
 * centigram scales ±2 steps, coarser scales ±1 step. Each rule also holds, at its largest, for
 * every coarser step (±3 steps up to ±0.015 g, ±2 steps up to ±0.1 g), so a coarser scale is
 * never taken as more accurate than a finer one.
 */
export function defaultScaleAccuracy(step: number): number {
  return Math.max(step, Math.min(2 * step, 0.1), Math.min(3 * step, 0.015));
}
