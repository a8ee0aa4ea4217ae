import type { SpecimenInput } from "./types";

/**
 * Inputs evaluated both in Chromium and on the server; their results must be bit-identical.
 * They cover both methods, repeats, the air-buoyancy option both ways, a stated scale
 * accuracy, every clamp (a pure-gold coin rounded past 19.32, no gold, lighter than the
 * host), a value off its range's centre, a silver host and a temperature span across water's
 * densest point.
 */
export const IDENTITY_VECTORS: SpecimenInput[] = [
  { method: "hanging", airGrams: [100], waterGrams: [62.72], finenessPermille: 850, finenessRangePermille: [700, 950] },
  {
    method: "buoyancy",
    airGrams: [48.62, 48.63, 48.62],
    waterGrams: [17.21, 17.2, 17.22],
    finenessPermille: 880,
    finenessRangePermille: [850, 910],
    waterTempC: 17.5,
  },
  { method: "hanging", airGrams: [152.31], waterGrams: [96.8], hostDensity: 2.72, hostDensityRange: [2.65, 2.85], waterTempC: 3, waterTempToleranceC: 2 },
  { method: "hanging", airGrams: [310.4], waterGrams: [196.3], scaleResolutionGrams: 0.1, airBuoyancyCorrection: true },
  { method: "buoyancy", airGrams: [21.4], waterGrams: [2.05], finenessPermille: 700 },
  { method: "hanging", airGrams: [100], waterGrams: [61] },
  { method: "hanging", airGrams: [1.23], waterGrams: [0.71], scaleResolutionGrams: 0.01, goldDensity: 17.5, finenessPermille: 900 },
  { method: "hanging", airGrams: [31.1, 31.11, 31.1], waterGrams: [29.51, 29.5, 29.51], finenessPermille: 999.9, scaleAccuracyGrams: 0.02 },
  { method: "hanging", airGrams: [100], waterGrams: [62.2], hostDensity: 2.65, hostDensityRange: [2.62, 2.68], airBuoyancyCorrection: false },
  { method: "buoyancy", airGrams: [100], waterGrams: [37.5, 37.45, 37.4], hostDensity: 2.62, hostDensityRange: [2.59, 2.65] },
  {
    method: "hanging",
    airGrams: [1000],
    waterGrams: [939.64],
    hostDensity: 10.495,
    hostDensityRange: [10.49, 10.5],
    scaleResolutionGrams: 0.1,
    scaleAccuracyGrams: 0.3,
  },
];
