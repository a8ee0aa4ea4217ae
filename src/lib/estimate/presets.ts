// Presets offered in the weigh-in flow. Sources beside each value; see shared REFERENCES.
// Each value is the centre of its range: the engine takes every assumption as rectangular over
// its range and centred on it, so the headline, the uncertainty and Monte Carlo agree.

export type HostPreset = { id: string; label: string; density: number; range: [number, number]; source: string };

export const HOST_PRESETS: HostPreset[] = [
  { id: "quartz", label: "Clean quartz", density: 2.65, range: [2.62, 2.68], source: "Holland & Powell ds62: quartz 2.648 g/cm³" },
  {
    id: "quartz-iron",
    label: "Quartz with iron oxide staining",
    density: 2.75,
    range: [2.65, 2.85],
    source: "ds62: quartz 2.648, goethite 4.268, hematite 5.275 (a few per cent)",
  },
  { id: "quartz-sulphide", label: "Quartz with sulphides", density: 2.9, range: [2.7, 3.1], source: "ds62: pyrite 5.011; arsenopyrite about 6.1 [memory]" },
  {
    id: "schist",
    label: "Schist",
    density: 2.6,
    range: [2.39, 2.81],
    source: "UBC geophysics rock density tables: schist 2.39–2.80 (top widened by 0.01 to centre on 2.60)",
  },
  { id: "calcite", label: "Calcite", density: 2.71, range: [2.68, 2.74], source: "ds62: calcite 2.713 g/cm³" },
];

export type FinenessPreset = { id: string; label: string; fineness: number; range: [number, number]; source: string };

export const FINENESS_PRESETS: FinenessPreset[] = [
  {
    id: "natural",
    label: "Natural gold, fineness unknown",
    fineness: 825,
    range: [700, 950],
    source: "Lindgren, USGS PP 73 (1911); Macdonald (2007) Table 1.7: most native gold 700–950 ‰",
  },
  {
    id: "placer",
    label: "High-purity placer gold",
    fineness: 920,
    range: [880, 960],
    source: "Macdonald (2007) Table 1.7: mature placer particles up to 956 ‰",
  },
  { id: "pure", label: "Pure gold (1000 ‰)", fineness: 1000, range: [1000, 1000], source: "CRC Handbook: gold 19.32 g/cm³" },
];

/** An assayed fineness is known to about ±5 ‰ (common practice for a fire assay report). */
export const ASSAY_HALF_RANGE = 5;
