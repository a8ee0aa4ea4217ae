"use client";
import { useLiveQuery } from "dexie-react-hooks";
import Link from "next/link";
import { discardRefusedChange } from "@/client/logbook";
import { useMember } from "@/client/member";
import { SyncStatusView } from "@/components/sync/sync-status";
import { formatWhen } from "@/lib/format";

const ENTITY_LINK: Record<string, (id: string) => string> = {
  find: (id) => `/finds/view#id=${id}`,
  outing: (id) => `/outings/view#id=${id}`,
};

/** Camp sync: what is waiting, what the server refused and why, and a way to fix or let go. */
export function CampSyncScreen() {
  const { db } = useMember();
  const entries = useLiveQuery(() => db.outbox.orderBy("id").toArray(), [db]);
  const refused = (entries ?? []).filter((e) => e.state === "rejected");
  const waiting = (entries ?? []).filter((e) => e.state === "pending");
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Camp sync</h1>
      <SyncStatusView db={db} />
      {refused.length > 0 && (
        <section className="sheet flex flex-col gap-2" aria-labelledby="refused-title" data-testid="refused">
          <h2 id="refused-title" className="heading-bar self-start text-lg text-rust">
            Refused by the club&apos;s server
          </h2>
          <p className="text-sm">These changes are kept here. Fix the record and save it again, or let the change go.</p>
          <ul className="flex flex-col gap-2">
            {refused.map((e) => {
              const [entity] = e.name.split(".");
              const link = ENTITY_LINK[entity];
              return (
                <li key={e.id} className="flex flex-col gap-1 border-b border-rule pb-2">
                  <span className="font-bold">
                    {e.name} · {formatWhen(e.createdAt)}
                  </span>
                  <span>
                    {e.reason}
                    {e.field ? ` (${e.field})` : ""}
                  </span>
                  <span className="flex gap-2">
                    {link && (
                      <Link className="btn" href={link(e.entityId)}>
                        Fix it
                      </Link>
                    )}
                    <button type="button" className="btn" onClick={() => discardRefusedChange(db, e.id!)}>
                      Let it go
                    </button>
                  </span>
                </li>
              );
            })}
          </ul>
        </section>
      )}
      <section className="sheet flex flex-col gap-2" aria-labelledby="waiting-title">
        <h2 id="waiting-title" className="heading-bar self-start text-lg">
          Waiting to send
        </h2>
        {waiting.length === 0 ? (
          <p>Nothing waiting.</p>
        ) : (
          <ul className="text-sm">
            {waiting.slice(0, 50).map((e) => (
              <li key={e.id}>
                {e.name} · {formatWhen(e.createdAt)}
              </li>
            ))}
            {waiting.length > 50 && <li>… and {waiting.length - 50} more</li>}
          </ul>
        )}
      </section>
    </div>
  );
}
