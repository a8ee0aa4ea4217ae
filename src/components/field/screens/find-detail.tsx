"use client";
import { useLiveQuery } from "@/client/live-query";
import { useQueryOnceCopied } from "@/client/first-copy";
import { IntentLink } from "@/components/intent-link";
import { useRouter } from "next/navigation";
import { lazy, Suspense, useEffect, useState } from "react";
import { useClaims, useSettings } from "@/client/hooks";
import { useHashParams } from "@/client/hash-params";
import type { PositionState } from "@/client/position";
import { deleteFind, saveFind, stripLocal } from "@/client/logbook";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import { KIND_LABELS } from "@/lib/entities/constants";
import { formatGrams, formatWhen } from "@/lib/format";
import { claimAt, formatDecimal } from "@/lib/geo";
import { LocationLine } from "../location-line";
import { Skeleton } from "../skeleton";

// The query thread, the photos block (thumbnails, camera, drop area), the weigh-ins (and the
// weigh-in flow behind them) and the editing form (and its form library) load just after the
// record itself: all are precached chunks, so offline too.
type Thread = typeof import("../query-thread").QueryThread;
let threadLoaded: Thread | null = null;
/** How long a reviewed find's first drawing waits for its thread's code before drawing without it. */
const THREAD_WAIT_MS = 1500;
const loadThread = () => import("../query-thread").then((m) => (threadLoaded = m.QueryThread));
const PhotosBlock = lazy(() => import("../photos-block").then((m) => ({ default: m.PhotosBlock })));
const WeighInsBlock = lazy(() => import("../weigh-ins-block").then((m) => ({ default: m.WeighInsBlock })));
const FindForm = lazy(() => import("../find-form").then((m) => ({ default: m.FindForm })));

export function FindDetailScreen() {
  const hash = useHashParams();
  const id = hash.get("id") ?? "";
  // "Saved" is said once, for the find just saved: the mark leaves the address at once, so a
  // reload or a later visit does not say it again.
  const [savedId, setSavedId] = useState<string | null>(null);
  const savedMark = hash.get("saved") === "1" ? hash.get("id") : null;
  if (savedMark !== null && savedMark !== savedId) setSavedId(savedMark);
  useEffect(() => {
    if (hash.get("saved") !== "1") return;
    const rest = new URLSearchParams(hash);
    rest.delete("saved");
    window.history.replaceState(window.history.state, "", `${window.location.pathname}#${rest}`);
  }, [hash]);
  const justSaved = savedId !== null && savedId === id;
  const { db } = useMember();
  const router = useRouter();
  // A live query keeps its last answer while it runs again for a new id: the answer says which
  // id it is for, so the previous find is never shown (or edited) under the next one's address.
  // Its officers' reviews and the member's answers come in the same read: a queried find opens
  // with its thread in place, above the rest, instead of pushing the rest down after.
  // On a device that has never synced, a find not on it waits for camp sync's first copy before
  // the screen says it is not here (a link opened on a new phone).
  const loaded = useQueryOnceCopied(
    db,
    async () => ({
      id,
      find: (await db.finds.get(id)) ?? null,
      reviews: await db.reviews.where("findId").equals(id).toArray(),
      answers: await db.answers.where("findId").equals(id).toArray(),
    }),
    [id],
    (r) => r.find !== null,
  );
  const find = loaded?.id === id ? loaded.find : undefined;
  // Most finds have no thread: its code loads only for one that has. The screen waits for it
  // before its first drawing of a find (a moment, THREAD_WAIT_MS at most), never after: a review
  // that camp sync brings while the find is open must not take the screen, and a form being
  // typed in, away.
  const needsThread = loaded?.id === id && loaded.reviews.length > 0;
  const [QueryThread, setQueryThread] = useState<Thread | null>(() => threadLoaded);
  // The find drawn (or done waiting for its thread): from then on the screen stays drawn.
  const [settledId, setSettledId] = useState<string | null>(null);
  const [threadFailedFor, setThreadFailedFor] = useState<string | null>(null);
  useEffect(() => {
    if (!needsThread || QueryThread) return;
    let live = true;
    const timer = setTimeout(() => live && setSettledId(id), THREAD_WAIT_MS);
    void loadThread().then(
      (t) => live && setQueryThread(() => t),
      // Its chunk out of reach (no signal, no worker yet): the find opens without it, and says so.
      () => {
        if (!live) return;
        setSettledId(id);
        setThreadFailedFor(id);
      },
    );
    return () => {
      live = false;
      clearTimeout(timer);
    };
  }, [needsThread, QueryThread, id]);
  const waitingForThread = needsThread && !QueryThread && settledId !== id;
  if (find !== undefined && !waitingForThread && settledId !== id) setSettledId(id);
  const claims = useClaims(db) ?? [];
  const settings = useSettings(db);
  const weighIns = useLiveQuery(() => db.weighIns.where("findId").equals(id).sortBy("weighedAt"), [db, id]);
  // Asked for when the member taps for it; the position code loads then.
  const [position, setPosition] = useState<PositionState>({ kind: "idle" });
  const locate = async () => {
    setPosition({ kind: "finding" });
    setPosition(await (await import("@/client/position")).askPosition());
  };

  if (find === undefined || waitingForThread) return <Skeleton />;
  if (find === null)
    return (
      <section className="sheet">
        <h1 className="text-xl font-bold">This find is not on this device</h1>
        <IntentLink href="/finds" className="btn mt-2">
          Back to finds
        </IntentLink>
      </section>
    );

  const save = async (next: Parameters<typeof saveFind>[1]) => {
    await saveFind(db, next);
    requestSync();
  };
  const useHere = async () => {
    if (position.kind !== "found") return locate();
    const p = position.position;
    await save({
      ...stripLocal(find),
      lat: p.lat,
      lon: p.lon,
      accuracyM: p.accuracyM,
      locationSource: "device",
      claimId: claimAt(p.lat, p.lon, claims)?.id ?? find.claimId,
    });
  };

  return (
    <div className="flex flex-col gap-4">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h1 className="text-2xl font-bold">
          {KIND_LABELS[find.kind]}
          {find.weightGrams != null && <span className="figure"> · {formatGrams(find.weightGrams, settings.massUnit)}</span>}
        </h1>
        <span className="text-ink-soft">{formatWhen(find.foundAt)}</span>
      </header>
      {justSaved && (
        <div className="sheet flex flex-wrap items-center justify-between gap-2">
          <p role="status" className="font-bold text-moss">
            Find saved on this device. It goes to the club at the next camp sync.
          </p>
          <IntentLink href="/finds/new" className="btn btn-primary">
            Log another find
          </IntentLink>
        </div>
      )}

      {QueryThread && loaded && <QueryThread db={db} find={find} reviews={loaded.reviews} answers={loaded.answers} weighIns={weighIns ?? []} />}
      {needsThread && !QueryThread && threadFailedFor === id && (
        <p className="sheet text-sm" role="status">
          The officers&apos; notes on this find could not be opened on this device yet. They show once the app has loaded here with signal.
        </p>
      )}

      <section className="sheet flex flex-col gap-2" aria-labelledby="where-title">
        <h2 id="where-title" className="heading-bar self-start text-lg">
          Where
        </h2>
        <LocationLine lat={find.lat} lon={find.lon} accuracyM={find.accuracyM} source={find.locationSource} claims={claims} />
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn" onClick={useHere}>
            {position.kind === "found" ? "Use this position now" : position.kind === "finding" ? "Finding…" : "Use my position"}
          </button>
          <IntentLink className="btn" href={`/map#pick=${find.id}`}>
            Pick on the map
          </IntentLink>
        </div>
        {position.kind === "found" && (
          <p className="text-sm">
            Device says {formatDecimal(position.position.lat, position.position.lon)} (± {Math.round(position.position.accuracyM)} m).
          </p>
        )}
        {position.kind === "failed" && <p className="text-sm text-rust">{position.message}</p>}
      </section>

      <Suspense
        fallback={
          <section className="sheet flex flex-col gap-3" aria-label="Photos">
            <h2 className="heading-bar self-start text-lg">Photos</h2>
            <Skeleton lines={1} />
          </section>
        }
      >
        <PhotosBlock db={db} findId={find.id} />
      </Suspense>

      <Suspense
        fallback={
          <section className="sheet flex flex-col gap-3" aria-label="Weigh-ins">
            <h2 className="heading-bar self-start text-lg">Weigh-ins</h2>
            <Skeleton lines={2} />
          </section>
        }
      >
        <WeighInsBlock db={db} find={find} weighIns={weighIns} claims={claims} settings={settings} />
      </Suspense>

      <Suspense fallback={<Skeleton />}>
        <FindForm key={find.id} find={find} claims={claims} settings={settings} onSave={save} />
      </Suspense>

      <button
        type="button"
        className="btn self-start border-rust text-rust"
        onClick={async () => {
          if (!window.confirm("Delete this find, its photos and weigh-ins from your logbook?")) return;
          await deleteFind(db, find.id);
          requestSync();
          router.push("/finds");
        }}
      >
        Delete this find
      </button>
    </div>
  );
}
