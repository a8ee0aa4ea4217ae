export type WeighMethod = "hanging" | "buoyancy";

export type SpecimenInput = {
  method: WeighMethod;
  /** One or more readings of the dry specimen in air, grams. */
  airGrams: number[];
  /** hanging: readings with it hung under water (apparatus tared);
   *  buoyancy: readings of the tared water vessel with it hung inside. */
  waterGrams: number[];
  /** The scale's display step (readability), grams. */
  scaleResolutionGrams?: number;
  /** The most one reading may be off, rounding included, as a scale's specification states
   *  it (repeatability and linearity), grams. Default: defaultScaleAccuracy(step). */
  scaleAccuracyGrams?: number;
  waterTempC?: number;
  waterTempToleranceC?: number;
  hostDensity?: number;
  hostDensityRange?: [number, number];
  finenessPermille?: number;
  finenessRangePermille?: [number, number];
  goldDensity?: number;
  /** Air buoyancy (OIML D 28), on unless false; false gives the textbook (vacuum) figure. */
  airBuoyancyCorrection?: boolean;
};

/**
 * What the engine noticed, as a code and the numbers behind it; the UI words it
 * (src/components/weigh/warning-text.ts). Densities in g/cm³, masses in grams.
 */
export type EstimateWarning =
  /** Lighter than the lightest host allowed: the host assumption is probably wrong. */
  | { code: "lighter_than_host"; params: { density: number; hostLow: number } }
  /** Within the host's range but not above its value: the estimate is held at 0. */
  | { code: "no_gold_detectable"; params: { density: number; host: number; highGrams: number } }
  /** Some gold at the centre, none at the low end of the range. */
  | { code: "gold_not_distinguishable"; params: { density: number; host: number } }
  /** Denser than pure gold at the centre, but not at the lowest density the readings allow. */
  | { code: "denser_than_gold_within_error"; params: { density: number; densityLow: number; goldDensity: number } }
  /** Denser than the chosen alloy: held at the whole specimen. */
  | { code: "denser_than_alloy"; params: { density: number; alloyDensity: number } }
  | { code: "range_wider_than_estimate"; params: { lowGrams: number; highGrams: number; estimateGrams: number } }
  /** The scale's step and accuracy alone move the gold figure appreciably. */
  | { code: "specimen_too_small"; params: { displacedGrams: number; accuracyGrams: number; scaleShare: number; scaleGrams: number } }
  | { code: "readings_disagree"; params: { readings: "air" | "water"; spreadGrams: number; limitGrams: number } }
  /** The in-water reading moves the way filling pores move it. */
  | { code: "water_reading_drifts"; params: { driftGrams: number } }
  /** The in-water reading moves the other way (bubbles gathering, a draft, a touch). */
  | { code: "water_reading_unsteady"; params: { driftGrams: number } }
  /** Denser minerals than the host count as gold; they could explain this density. */
  | { code: "heavy_minerals_count_as_gold"; params: { density: number; heaviestGangue: number } }
  /** Finenesses whose alloy is lighter than the specimen itself are impossible: only the rest of the range is used. */
  | { code: "fineness_narrowed"; params: { givenLow: number; givenHigh: number; usedLow: number; densityLow: number } }
  /** A value given off the centre of its range: the centre is used. */
  | { code: "value_not_centred"; params: { quantity: "hostDensity" | "finenessPermille"; given: number; used: number } };

export type WarningCode = EstimateWarning["code"];

/** The values the engine worked with, so what is shown beside a result never retypes a default. */
export type EstimateAssumptions = {
  airBuoyancyCorrection: boolean;
  scaleResolutionGrams: number;
  scaleAccuracyGrams: number;
  waterTempC: number;
  waterTempRangeC: [number, number];
  hostDensity: number;
  hostDensityRange: [number, number];
  finenessPermille: number;
  finenessRangePermille: [number, number];
  /** The gold alloy's density at the central fineness (or the density given). */
  goldAlloyDensity: number;
};

export type SpecimenEstimate = {
  specimenDensity: number;
  volumeCm3: number;
  goldAlloyGrams: number;
  fineGoldGrams: number;
  goldMassPercent: number;
  goldVolumePercent: number;
  /** The lowest and highest over every reading and assumption at its worst, at once. */
  range: { goldAlloyGrams: [number, number]; fineGoldGrams: [number, number] };
  /** One standard uncertainty (JCGM 100:2008) of the mixture formula before it is held to [0, mass]. */
  standardUncertainty: { goldAlloyGrams: number; fineGoldGrams: number };
  warnings: EstimateWarning[];
  assumptions: EstimateAssumptions;
  engineVersion: string;
};
