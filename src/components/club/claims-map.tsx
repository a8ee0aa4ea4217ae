import type { ClaimView } from "@/lib/entities/claim";
import { planOutlines } from "@/lib/club/outline-plan";

const PLAN_WIDTH = 800;

/**
 * The club's claims as a plan of their outlines, each labelled (with its production where
 * given). Drawn on the server as SVG: the console needs the claims' shapes and where they lie
 * against each other, not a map to pan, so it sends no map code at all. Labels are HTML over
 * the plan so their text stays 14 px at any width.
 */
export function ClaimsMap({ claims, labels }: { claims: Pick<ClaimView, "id" | "name" | "boundary">[]; labels: Record<string, string> }) {
  const plan = planOutlines(claims, PLAN_WIDTH);
  const byId = new Map(claims.map((c) => [c.id, c]));
  const unmapped = claims.filter((c) => !plan.claims.some((p) => p.id === c.id));
  return (
    <figure className="flex w-full max-w-4xl flex-col gap-2">
      <div
        className="relative w-full overflow-hidden rounded-md border-2 border-edge bg-paper"
        style={{ aspectRatio: `${plan.width} / ${plan.height}` }}
        data-testid="claims-plan"
      >
        <svg viewBox={`0 0 ${plan.width} ${plan.height}`} className="absolute inset-0 h-full w-full" aria-hidden="true">
          <defs>
            <pattern id="plan-grid" width="40" height="40" patternUnits="userSpaceOnUse">
              <path d="M40 0H0V40" fill="none" stroke="var(--rule)" strokeWidth="1" />
            </pattern>
          </defs>
          <rect width={plan.width} height={plan.height} fill="url(#plan-grid)" />
          {plan.claims.map((c) => (
            <path
              key={c.id}
              d={c.path}
              fill="var(--ochre)"
              fillOpacity="0.15"
              fillRule="evenodd"
              stroke="var(--ochre)"
              strokeWidth="3"
              strokeLinejoin="round"
            />
          ))}
          {plan.scale && (
            <g transform={`translate(24 ${plan.height - 24})`} stroke="var(--ink)" strokeWidth="3" fill="none">
              <path d={`M0 -8V0H${plan.scale.length}V-8`} />
            </g>
          )}
          <g transform={`translate(${plan.width - 32} 48)`} fill="var(--ink)">
            <path d="M0 -28L10 0H-10Z" />
          </g>
        </svg>
        {plan.claims.map((c) => (
          <span
            key={c.id}
            className={`absolute max-w-[45%] -translate-x-1/2 rounded bg-sheet/90 px-1.5 text-center text-sm font-bold text-ink shadow ${c.label.above ? "-translate-y-[calc(100%+4px)]" : "translate-y-1"}`}
            style={{ left: `${(c.label.x / plan.width) * 100}%`, top: `${(c.label.y / plan.height) * 100}%` }}
          >
            {labels[c.id] ?? byId.get(c.id)?.name}
          </span>
        ))}
        {plan.scale && (
          <span className="absolute text-sm font-bold text-ink" style={{ left: `${(24 / plan.width) * 100}%`, bottom: `${(34 / plan.height) * 100}%` }}>
            {plan.scale.metres >= 1000 ? `${plan.scale.metres / 1000} km` : `${plan.scale.metres} m`}
          </span>
        )}
        <span className="absolute text-sm font-bold text-ink" style={{ right: `${(26 / plan.width) * 100}%`, top: `${(52 / plan.height) * 100}%` }}>
          N
        </span>
        {plan.claims.length === 0 && <p className="absolute inset-0 grid place-items-center text-ink-soft">No claim has an outline yet.</p>}
      </div>
      <figcaption className="text-sm text-ink-soft">
        Outlines as recorded, north up, to the scale shown.
        {unmapped.length > 0 && ` No outline yet: ${unmapped.map((c) => labels[c.id] ?? c.name).join("; ")}.`}
      </figcaption>
    </figure>
  );
}
