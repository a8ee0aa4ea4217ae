"use client";
import { useLiveQuery } from "@/client/live-query";
import { IntentLink } from "@/components/intent-link";
import type { LodebookDb } from "@/client/device-db";
import { readQueryStates } from "@/client/query-states";
import { KIND_LABELS } from "@/lib/entities/constants";
import { formatDay } from "@/lib/format";

/** The member's finds an officer has queried and the member has not answered, in one read. */
const readQueried = (db: LodebookDb) =>
  db.transaction("r", [db.reviews, db.answers, db.finds], async () => {
    const ids = [...(await readQueryStates(db))].filter(([, state]) => state === "queried").map(([id]) => id);
    return (await db.finds.bulkGet(ids)).filter((f) => f !== undefined);
  });

/**
 * On Today: the finds an officer has queried and the member has not answered yet, each a link
 * to answer it. Loaded by Today (screens/today.tsx) once the device holds a review, with the
 * query logic it needs: most members have none, and it need not weigh on the home screen's
 * first load.
 */
export function QueriedFinds({ db }: { db: LodebookDb }) {
  const shown = useLiveQuery(() => readQueried(db), [db]) ?? [];
  if (shown.length === 0) return null;
  return (
    <section className="sheet flex flex-col gap-2 border-rust" aria-labelledby="queried-title" data-testid="queried-finds">
      <h2 id="queried-title" className="text-lg font-bold text-rust">
        The club queried {shown.length === 1 ? "a find" : `${shown.length} finds`} of yours
      </h2>
      <ul className="flex flex-col gap-1">
        {shown.map((f) => (
          <li key={f.id}>
            <IntentLink href={`/finds/view#id=${f.id}`}>
              {KIND_LABELS[f.kind]} of {formatDay(f.foundAt)}: read the question and answer it
            </IntentLink>
          </li>
        ))}
      </ul>
    </section>
  );
}
