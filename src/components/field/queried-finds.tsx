"use client";
import { useLiveQuery } from "dexie-react-hooks";
import Link from "next/link";
import type { LodebookDb } from "@/client/device-db";
import { useQueryStates } from "@/client/query-states";
import { KIND_LABELS } from "@/lib/entities/constants";
import { formatDay } from "@/lib/format";

/** On Today: the finds an officer has queried and the member has not answered yet, each a link to answer it. */
export function QueriedFinds({ db }: { db: LodebookDb }) {
  const states = useQueryStates(db);
  const ids = [...(states ?? [])].filter(([, s]) => s === "queried").map(([id]) => id);
  const finds = useLiveQuery(() => db.finds.bulkGet(ids), [db, ids.join()]);
  const shown = (finds ?? []).filter((f) => f !== undefined);
  if (shown.length === 0) return null;
  return (
    <section className="sheet flex flex-col gap-2 border-rust" aria-labelledby="queried-title" data-testid="queried-finds">
      <h2 id="queried-title" className="text-lg font-bold text-rust">
        The club queried {shown.length === 1 ? "a find" : `${shown.length} finds`} of yours
      </h2>
      <ul className="flex flex-col gap-1">
        {shown.map((f) => (
          <li key={f.id}>
            <Link href={`/finds/view#id=${f.id}`}>
              {KIND_LABELS[f.kind]} of {formatDay(f.foundAt)}: read the question and answer it
            </Link>
          </li>
        ))}
      </ul>
    </section>
  );
}
