import { METHOD_LABELS, OUTING_METHODS } from "@/lib/entities/constants";

/** The club's claims as <option>s, by name. */
export function ClaimOptions({ claims }: { claims: { id: string; name: string | null }[] }) {
  return (
    <>
      {claims.map((c) => (
        <option key={c.id} value={c.id}>
          {c.name}
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
