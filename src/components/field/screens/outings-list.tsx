"use client";
import { useQueryOnceCopied } from "@/client/first-copy";
import { IntentLink } from "@/components/intent-link";
import { useClaims } from "@/client/hooks";
import { useMember } from "@/client/member";
import { METHOD_LABELS } from "@/lib/entities/constants";
import { countOf, formatDay } from "@/lib/format";
import { Skeleton } from "../skeleton";

export function OutingsScreen() {
  const { db } = useMember();
  const claims = useClaims(db) ?? [];
  // The outings and their find counts in one read: drawn together, so no count line changes
  // under the member's eyes after the list is there.
  const read = useQueryOnceCopied(
    db,
    () =>
      db.transaction("r", [db.outings, db.finds], async () => {
        const counts = new Map<string, number>();
        await db.finds.each((f) => f.outingId && counts.set(f.outingId, (counts.get(f.outingId) ?? 0) + 1));
        return { outings: await db.outings.orderBy("startedAt").reverse().toArray(), counts };
      }),
    [],
  );
  const outings = read?.outings;
  const counts = read?.counts;
  const claimName = (id: string | null) => claims.find((c) => c.id === id)?.name ?? "off-claim";
  return (
    <>
      {outings === undefined ? (
        <Skeleton />
      ) : outings.length === 0 ? (
        <p className="text-ink-soft">No outings yet.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {outings.map((o) => (
            <li key={o.id}>
              <IntentLink href={`/outings/view#id=${o.id}`} className="sheet flex items-baseline justify-between gap-2 no-underline">
                <span>
                  <span className="font-bold">{formatDay(o.startedAt)}</span> · {METHOD_LABELS[o.method]} on {claimName(o.claimId)}
                  {o.endedAt === null && <span className="ml-2 font-bold text-moss">under way</span>}
                </span>
                <span className="text-sm">{countOf(counts?.get(o.id) ?? 0, "find", "finds")}</span>
              </IntentLink>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
