"use client";
import { useLiveQuery } from "@/client/live-query";
import { IntentLink } from "@/components/intent-link";
import { discardRefusedChange } from "@/client/logbook";
import { requestSync } from "@/client/sync/scheduler";
import type { LodebookDb, OutboxEntry } from "@/client/device-db";
import { useMember } from "@/client/member";
import { PhotosLater } from "@/components/sync/photos-later";
import { SyncStatusView } from "@/components/sync/sync-status";
import { formatWhen } from "@/lib/format";
import { changeWords } from "@/lib/sync/change-words";

const ENTITY_LINK: Record<string, (id: string) => string> = {
  find: (id) => `/finds/view#id=${id}`,
  outing: (id) => `/outings/view#id=${id}`,
  scale: () => "/scales",
  barrenRock: () => "/barren-rock",
};

/** Camp sync: what is waiting, what the server refused and why, and a way to fix or let go. */
export function CampSyncScreen() {
  const { db } = useMember();
  const entries = useLiveQuery(() => db.outbox.orderBy("id").toArray(), [db]);
  const refused = (entries ?? []).filter((e) => e.state === "rejected");
  const waiting = (entries ?? []).filter((e) => e.state === "pending");
  const stuck = (entries ?? []).filter((e) => e.state === "stuck");
  return (
    <>
      <SyncStatusView db={db} />
      <PhotosLater db={db} />
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
                    {changeWords(e.name)} · {formatWhen(e.createdAt)}
                  </span>
                  <span>
                    {e.reason}
                    {e.field ? ` (${e.field})` : ""}
                  </span>
                  <span className="flex gap-2">
                    {link && (
                      <IntentLink className="btn" href={link(e.entityId)}>
                        Fix it
                      </IntentLink>
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
      {stuck.length > 0 && <StuckChanges entries={stuck} onRetry={() => void retryStuckChanges(db)} />}
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
                {changeWords(e.name)} · {formatWhen(e.createdAt)}
              </li>
            ))}
            {waiting.length > 50 && <li>… and {waiting.length - 50} more</li>}
          </ul>
        )}
      </section>
    </>
  );
}

/** "Try again": the stuck changes go back in the queue, and a sync starts. */
async function retryStuckChanges(db: LodebookDb) {
  const { retryStuck } = await import("@/client/sync/recover");
  await retryStuck(db);
  requestSync();
}

/** The body of a "send to the club" report: what is stuck and the ids the server's log keeps the failures under. */
function reportText(entries: OutboxEntry[]): string {
  const lines = entries.map((e) => `- ${changeWords(e.name)} (${e.entityId}), saved ${formatWhen(e.createdAt)}: server error id ${e.errorId ?? "none"}`);
  return ["The club's server fails on these changes from my device each time they are sent:", ...lines, "", "(Lodebook camp sync report)"].join("\n");
}

/**
 * Changes the server failed on each time (RELIABILITY 39): set aside so the rest goes up, said
 * in plain words, with a report an officer can match to the server's log by its error ids.
 */
function StuckChanges({ entries, onRetry }: { entries: OutboxEntry[]; onRetry: () => void }) {
  const mail = `mailto:?subject=${encodeURIComponent("Lodebook: changes the server cannot take")}&body=${encodeURIComponent(reportText(entries))}`;
  return (
    <section className="sheet flex flex-col gap-2" aria-labelledby="stuck-title" data-testid="stuck">
      <h2 id="stuck-title" className="heading-bar self-start text-lg text-rust">
        Stuck: the server fails on {entries.length === 1 ? "this change" : "these changes"}
      </h2>
      <p className="text-sm">
        The club&apos;s server ran into a problem each time {entries.length === 1 ? "this change was" : "these changes were"} sent. Nothing is lost:{" "}
        {entries.length === 1 ? "it is" : "they are"} kept on this device, and your other changes went on. Send the report to the club so an officer can look
        into it, then try again later.
      </p>
      <ul className="text-sm">
        {entries.map((e) => (
          <li key={e.id}>
            {changeWords(e.name)} · {formatWhen(e.createdAt)} · error id <code>{e.errorId}</code>
          </li>
        ))}
      </ul>
      <span className="flex flex-wrap gap-2">
        <a className="btn" href={mail}>
          Send to the club
        </a>
        <button type="button" className="btn" onClick={onRetry}>
          Try again
        </button>
      </span>
    </section>
  );
}
