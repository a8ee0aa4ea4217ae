export type WeighMethod = "hanging" | "buoyancy";

export type SpecimenInput = {
  method: WeighMethod;
  /** One or more readings of the dry specimen in air, grams. */
  airGrams: number[];
  /** hanging: readings with it hung under water (apparatus tared);
   *  buoyancy: readings of the tared water vessel with it hung inside. */
  waterGrams: number[];
  scaleResolutionGrams?: number;
  waterTempC?: number;
  waterTempToleranceC?: number;
  hostDensity?: number;
  hostDensityRange?: [number, number];
  finenessPermille?: number;
  finenessRangePermille?: [number, number];
  goldDensity?: number;
  airBuoyancyCorrection?: boolean;
};

export type EstimateWarning = { code: string; message: string };

export type SpecimenEstimate = {
  specimenDensity: number;
  volumeCm3: number;
  goldAlloyGrams: number;
  fineGoldGrams: number;
  goldMassPercent: number;
  goldVolumePercent: number;
  range: { goldAlloyGrams: [number, number]; fineGoldGrams: [number, number] };
  standardUncertainty: { goldAlloyGrams: number; fineGoldGrams: number };
  warnings: EstimateWarning[];
  engineVersion: string;
};
