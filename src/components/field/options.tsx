import { METHOD_LABELS, OUTING_METHODS } from "@/lib/entities/constants";

/**
 * The club's claims as <option>s, by name. A retired claim is kept for history: it is offered
 * only where a record already names it (`current`), marked as retired.
 */
export function ClaimOptions({ claims, current }: { claims: { id: string; name: string | null; active?: boolean }[]; current?: string | null }) {
  return (
    <>
      {claims
        .filter((c) => c.active !== false || c.id === current)
        .map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
            {c.active === false ? " (retired)" : ""}
          </option>
        ))}
    </>
  );
}

/** The ways of working a claim as <option>s. */
export function MethodOptions() {
  return (
    <>
      {OUTING_METHODS.map((m) => (
        <option key={m} value={m}>
          {METHOD_LABELS[m]}
        </option>
      ))}
    </>
  );
}
