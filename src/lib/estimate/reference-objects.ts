import { GOLD_DENSITY } from "./alloy";

// Reference objects for the setup check. Each density names its source (see the shared
// REFERENCES); the uncertainty (one standard uncertainty, k = 1) is our allowance for a real
// object of that kind, stated beside it.

export type ReferenceObject = { id: "copper" | "gold-coin" | "quartz"; label: string; density: number; uncertainty: number; source: string };

export const REFERENCE_OBJECTS: readonly ReferenceObject[] = [
  {
    id: "copper",
    label: "Pure copper slug (drawn or machined, not cast)",
    density: 8.96,
    uncertainty: 0.02,
    source: "CRC Handbook: copper 8.96 g/cm³ [from memory, not confirmed in a source]; ± 0.02 our allowance for the metal's working",
  },
  {
    id: "gold-coin",
    label: "999.9 gold coin",
    density: GOLD_DENSITY,
    uncertainty: 0.02,
    source: "CRC Handbook, 55th ed., p. B-15: gold 19.32 g/cm³ at 20 °C; ± 0.02 our allowance for a struck coin",
  },
  {
    id: "quartz",
    label: "Clear quartz crystal",
    density: 2.648,
    uncertainty: 0.003,
    source: "Holland & Powell ds62: quartz 2.648 g/cm³; ± 0.003 our allowance for a clear crystal without inclusions",
  },
];

/** The member's own object, measured once: its density and standard uncertainty, as entered. */
export const OWN_REFERENCE = "own";
