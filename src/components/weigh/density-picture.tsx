import type { SpecimenEstimate } from "@/lib/estimate/types";

type Props = { estimate: SpecimenEstimate; specimenGrams: number; unitLabel: (g: number) => string };

const W = 320;
const PAD = 12;
// Density axis on a log scale, water to pure gold, so quartz and gold both have room.
const LOG_MIN = Math.log(1);
const LOG_MAX = Math.log(20);
const xDensity = (d: number) => PAD + ((Math.log(Math.min(Math.max(d, 1), 20)) - LOG_MIN) / (LOG_MAX - LOG_MIN)) * (W - 2 * PAD);

/** Where the specimen sits between its host rock and gold, and the span of the estimate. */
export function DensityPicture({ estimate, specimenGrams, unitLabel }: Props) {
  // The host and alloy the engine worked with, not retyped defaults.
  const hostDensity = estimate.assumptions.hostDensity;
  const alloyDensity = estimate.assumptions.goldAlloyDensity;
  const xs = xDensity(estimate.specimenDensity);
  const [lo, hi] = estimate.range.goldAlloyGrams;
  const xg = (g: number) => PAD + (Math.min(Math.max(g, 0), specimenGrams) / specimenGrams) * (W - 2 * PAD);
  return (
    <figure className="flex flex-col gap-1">
      <svg
        viewBox={`0 0 ${W} 120`}
        className="w-full"
        role="img"
        aria-label={`Specimen density ${estimate.specimenDensity.toFixed(2)} g/cm³, between host rock ${hostDensity.toFixed(2)} and gold alloy ${alloyDensity.toFixed(2)}; gold alloy at worst between ${unitLabel(lo)} and ${unitLabel(hi)}.`}
      >
        <text x={PAD} y={12} fontSize="11" fill="var(--ink-soft)">
          Density, g/cm³
        </text>
        <line x1={PAD} x2={W - PAD} y1={30} y2={30} stroke="var(--rule)" strokeWidth={6} strokeLinecap="round" />
        <line x1={xDensity(hostDensity)} x2={xDensity(alloyDensity)} y1={30} y2={30} stroke="var(--ochre)" strokeOpacity={0.35} strokeWidth={6} />
        {[
          { d: hostDensity, label: "rock" },
          { d: alloyDensity, label: "gold" },
        ].map((m) => (
          <g key={m.label}>
            <line x1={xDensity(m.d)} x2={xDensity(m.d)} y1={22} y2={38} stroke="var(--ink)" strokeWidth={2} />
            <text x={xDensity(m.d)} y={50} fontSize="10" textAnchor="middle" fill="var(--ink)">
              {m.label} {m.d.toFixed(2)}
            </text>
          </g>
        ))}
        <circle cx={xs} cy={30} r={6} fill="var(--ochre)" stroke="var(--ink)" strokeWidth={1.5} />
        <text x={Math.min(Math.max(xs, 40), W - 40)} y={18} fontSize="10" textAnchor="middle" fontWeight="bold" fill="var(--ink)">
          specimen {estimate.specimenDensity.toFixed(3)}
        </text>

        <text x={PAD} y={74} fontSize="11" fill="var(--ink-soft)">
          Gold alloy in the specimen
        </text>
        <rect x={PAD} y={84} width={W - 2 * PAD} height={12} rx={3} fill="var(--rule)" />
        <rect x={xg(lo)} y={84} width={Math.max(2, xg(hi) - xg(lo))} height={12} rx={3} fill="var(--ochre)" fillOpacity={0.45} />
        <line x1={xg(estimate.goldAlloyGrams)} x2={xg(estimate.goldAlloyGrams)} y1={80} y2={100} stroke="var(--ink)" strokeWidth={2.5} />
        <text x={PAD} y={114} fontSize="10" fill="var(--ink-soft)">
          0
        </text>
        <text x={W - PAD} y={114} fontSize="10" textAnchor="end" fill="var(--ink-soft)">
          whole specimen {unitLabel(specimenGrams)}
        </text>
      </svg>
    </figure>
  );
}
