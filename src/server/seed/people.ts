import "server-only";

// An invented club on invented claims. Any likeness to a real club, person or claim is chance.
export const DEMO_CLUB = "Quillmarsh Gulch Prospectors";
export const DEMO_PASSWORDS = { officer: "officer-demo-pass", member: "member-demo-pass" } as const;

export const DEMO_PEOPLE = [
  { name: "Marguerite Okafor", email: "marguerite@quillmarsh.example", role: "officer" },
  { name: "Dale Whitcombe", email: "dale@quillmarsh.example", role: "officer" },
  { name: "Ines Varga", email: "ines@quillmarsh.example", role: "member" },
  { name: "Tobias Lund", email: "tobias@quillmarsh.example", role: "member" },
  { name: "Ruth Nakamura", email: "ruth@quillmarsh.example", role: "member" },
  { name: "Cal Brennan", email: "cal@quillmarsh.example", role: "member" },
  { name: "Priya Delacroix", email: "priya@quillmarsh.example", role: "member" },
  { name: "Hugo Stenmark", email: "hugo@quillmarsh.example", role: "member" },
] as const;

/** Claim centres (WGS 84) and half-sizes in metres; boundaries are drawn from these. */
export const DEMO_CLAIMS = [
  {
    name: "Larkspur Bench",
    kind: "placer",
    agencyRef: "DEMO-PL-0001",
    lat: 41.8,
    lon: -117.62,
    halfW: 300,
    halfH: 140,
    turn: 0.25,
    rules: "Hand tools and detectors only. Fill every hole. Guests with a member at all times.",
  },
  {
    name: "Tinderbox Wash",
    kind: "placer",
    agencyRef: "DEMO-PL-0002",
    lat: 41.8062,
    lon: -117.6045,
    halfW: 380,
    halfH: 110,
    turn: -0.4,
    rules: "Dry wash: leave at once if storms build upstream. Drywashers allowed; no motorised digging.",
  },
  {
    name: "Old Cobb Reef",
    kind: "lode",
    agencyRef: "DEMO-LD-0003",
    lat: 41.7935,
    lon: -117.6118,
    halfW: 228,
    halfH: 91,
    turn: 0.6,
    rules: "Old workings are fenced: never enter them. Surface specimens only; no blasting.",
  },
  {
    name: "Sixmile Terrace",
    kind: "placer",
    agencyRef: "DEMO-PL-0004",
    lat: 41.8121,
    lon: -117.6282,
    halfW: 250,
    halfH: 200,
    turn: 0.1,
    rules: "Terrace gravels: pan and sluice at the creek only, and carry water back up.",
  },
] as const;
