"use client";
import { useLiveQuery } from "@/client/live-query";
import { useQueryOnceCopied } from "@/client/first-copy";
import { IntentLink } from "@/components/intent-link";
import { useRouter } from "next/navigation";
import { lazy, Suspense } from "react";
import { useClaims } from "@/client/hooks";
import { useHashParams } from "@/client/hash-params";
import { deleteOuting, endOuting, saveOuting, stripLocal } from "@/client/logbook";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import { KIND_LABELS } from "@/lib/entities/constants";
import { formatWhen } from "@/lib/format";
import { Skeleton } from "../skeleton";

// The editing form (and its form library) loads after the outing's heading, its state and its finds.
const OutingForm = lazy(() => import("../outing-form").then((m) => ({ default: m.OutingForm })));

export function OutingDetailScreen() {
  const id = useHashParams().get("id") ?? "";
  const { db } = useMember();
  const router = useRouter();
  const claims = useClaims(db) ?? [];
  // The answer names its id: the previous outing is never shown under the next one's address.
  // On a device that has never synced, an outing not on it waits for camp sync's first copy
  // before the screen says it is not here.
  const loaded = useQueryOnceCopied(
    db,
    async () => ({ id, outing: (await db.outings.get(id)) ?? null }),
    [id],
    (r) => r.outing !== null,
  );
  const outing = loaded?.id === id ? loaded.outing : undefined;
  const finds = useLiveQuery(() => db.finds.where("outingId").equals(id).toArray(), [db, id]);
  if (outing === undefined) return <Skeleton />;
  if (outing === null) return <p className="sheet">This outing is not on this device.</p>;
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Outing of {formatWhen(outing.startedAt)}</h1>
      {outing.endedAt === null && (
        <button
          type="button"
          className="btn btn-primary self-start"
          onClick={async () => {
            await endOuting(db, stripLocal(outing));
            requestSync();
          }}
        >
          End the outing now
        </button>
      )}
      <Suspense fallback={<Skeleton />}>
        <OutingForm
          key={outing.id}
          outing={outing}
          claims={claims}
          onSave={async (next) => {
            await saveOuting(db, next);
            requestSync();
          }}
        />
      </Suspense>
      <section className="flex flex-col gap-2">
        <h2 className="heading-bar self-start text-lg">Finds on this outing</h2>
        {(finds ?? []).map((f) => (
          <IntentLink key={f.id} className="sheet no-underline" href={`/finds/view#id=${f.id}`}>
            {KIND_LABELS[f.kind]} · {formatWhen(f.foundAt)}
          </IntentLink>
        ))}
      </section>
      <button
        type="button"
        className="btn self-start border-rust text-rust"
        onClick={async () => {
          if (!window.confirm("Delete this outing? Its finds stay in your logbook.")) return;
          await deleteOuting(db, outing.id);
          requestSync();
          router.push("/outings");
        }}
      >
        Delete this outing
      </button>
    </div>
  );
}
