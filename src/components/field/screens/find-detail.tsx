"use client";
import { useLiveQuery } from "dexie-react-hooks";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { lazy, Suspense, useState } from "react";
import { useClaims, useSettings } from "@/client/hooks";
import { useHashParams } from "@/client/hash-params";
import type { PositionState } from "@/client/position";
import { deleteFind, deleteWeighIn, newId, saveFind, saveWeighIn, stripLocal } from "@/client/logbook";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import type { LocalFind, LocalWeighIn } from "@/client/device-db";
import { KIND_LABELS } from "@/lib/entities/constants";
import type { MassUnit } from "@/lib/estimate/units";
import { FINE_BASIS_LABELS, weighMismatch } from "@/lib/figures/fine-basis";
import { claimGoldOf } from "@/lib/figures/claim-gold";
import { formatGrams, formatWhen } from "@/lib/format";
import { claimAt } from "@/lib/geo";
import { engineLabel } from "@/components/weigh/engine-label";
import { LocationLine } from "../location-line";
import { QueryThread } from "../query-thread";
import { Skeleton } from "../skeleton";

// The weigh-in flow (and the estimate engine with it) loads when the member starts weighing.
// (React's lazy: Suspense shows a skeleton meanwhile, with no loader library in the first load.)
const WeighInFlow = lazy(() => import("@/components/weigh/weigh-in-flow").then((m) => ({ default: m.WeighInFlow })));

// The photos block (thumbnails, camera, drop area) and the editing form (and its form library)
// load just after the record itself: both are precached chunks, so offline too.
const PhotosBlock = lazy(() => import("../photos-block").then((m) => ({ default: m.PhotosBlock })));
const FindForm = lazy(() => import("../find-form").then((m) => ({ default: m.FindForm })));

/** The find's fine gold as the club's server figured it, and a warning when its weigh-in disagrees with its weight. */
function FineGoldLine({ find, latestAir, unit }: { find: LocalFind; latestAir: number[]; unit: MassUnit }) {
  const f = find.figure;
  const mismatch = weighMismatch(find.weightGrams, latestAir);
  return (
    <div data-testid="find-fine-gold" className="flex flex-col gap-1">
      {f && f.fineGrams != null ? (
        <p>
          Fine gold <span className="figure font-bold">≈ {formatGrams(f.fineGrams, unit)}</span>
          {f.low !== f.high && f.low != null && f.high != null && (
            <span className="figure">
              {" "}
              (at worst {formatGrams(f.low, unit)} – {formatGrams(f.high, unit)})
            </span>
          )}
          {f.basis && <span className="text-ink-soft"> · by {FINE_BASIS_LABELS[f.basis]}</span>}
        </p>
      ) : (
        <p className="text-ink-soft">
          {find.kind === "specimen" ? "Weigh this specimen for a fine-gold figure." : "Its fine-gold figure comes back with the next camp sync."}
        </p>
      )}
      {mismatch && (
        <p className="font-bold text-rust" role="note" data-testid="weigh-mismatch">
          The weigh-in&apos;s air reading is far from this find&apos;s recorded weight. Check the weight or weigh it again.
        </p>
      )}
    </div>
  );
}

/** Which scale a weigh-in was made on, and what its last setup check said then. */
function ScaleLine({ scaleCheck, scaleName }: { scaleCheck: LocalWeighIn["scaleCheck"]; scaleName: string | null }) {
  if (!scaleName) return null;
  if (!scaleCheck) return <span className="w-full text-xs text-ink-soft" data-testid="weigh-in-scale" data-standing="unchecked">On {scaleName}, not checked then.</span>;
  return scaleCheck.passed ? (
    <span className="w-full text-xs text-moss" data-testid="weigh-in-scale" data-standing="passed">
      On {scaleName}, whose setup check passed ({formatWhen(scaleCheck.checkedAt)}).
    </span>
  ) : (
    <span className="w-full text-sm font-bold text-rust" data-testid="weigh-in-scale" data-standing="failed">
      Made on {scaleName}, whose last setup check ({formatWhen(scaleCheck.checkedAt)}) failed: the rig was off, so this estimate may be too.
    </span>
  );
}

export function FindDetailScreen() {
  const hash = useHashParams();
  const id = hash.get("id") ?? "";
  const justSaved = hash.get("saved") === "1";
  const { db } = useMember();
  const router = useRouter();
  // A live query keeps its last answer while it runs again for a new id: the answer says which
  // id it is for, so the previous find is never shown (or edited) under the next one's address.
  const loaded = useLiveQuery(async () => ({ id, find: (await db.finds.get(id)) ?? null }), [db, id]);
  const find = loaded?.id === id ? loaded.find : undefined;
  const claims = useClaims(db) ?? [];
  const settings = useSettings(db);
  const weighIns = useLiveQuery(() => db.weighIns.where("findId").equals(id).sortBy("weighedAt"), [db, id]);
  const scales = useLiveQuery(() => db.scales.toArray(), [db]);
  // Asked for when the member taps for it; the position code loads then.
  const [position, setPosition] = useState<PositionState>({ kind: "idle" });
  const locate = async () => {
    setPosition({ kind: "finding" });
    setPosition(await (await import("@/client/position")).askPosition());
  };
  const [weighing, setWeighing] = useState(false);
  const latest = weighIns?.[weighIns.length - 1];

  if (find === undefined) return <Skeleton />;
  if (find === null)
    return (
      <section className="sheet">
        <h1 className="text-xl font-bold">This find is not on this device</h1>
        <Link href="/finds" className="btn mt-2">
          Back to finds
        </Link>
      </section>
    );

  const save = async (next: Parameters<typeof saveFind>[1]) => {
    await saveFind(db, next);
    requestSync();
  };
  const useHere = async () => {
    if (position.kind !== "found") return locate();
    const p = position.position;
    await save({ ...stripLocal(find), lat: p.lat, lon: p.lon, accuracyM: p.accuracyM, locationSource: "device", claimId: claimAt(p.lat, p.lon, claims)?.id ?? find.claimId });
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
        <p role="status" className="sheet font-bold text-moss">
          Find saved on this device. It goes to the club at the next camp sync.
        </p>
      )}

      <QueryThread db={db} find={find} weighIns={weighIns ?? []} />

      <section className="sheet flex flex-col gap-2" aria-labelledby="where-title">
        <h2 id="where-title" className="heading-bar self-start text-lg">
          Where
        </h2>
        <LocationLine lat={find.lat} lon={find.lon} accuracyM={find.accuracyM} source={find.locationSource} claims={claims} />
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn" onClick={useHere}>
            {position.kind === "found" ? "Use this position now" : position.kind === "finding" ? "Finding…" : "Use my position"}
          </button>
          <Link className="btn" href={`/map#pick=${find.id}`}>
            Pick on the map
          </Link>
        </div>
        {position.kind === "found" && (
          <p className="text-sm">
            Device says {position.position.lat.toFixed(6)}, {position.position.lon.toFixed(6)} (± {Math.round(position.position.accuracyM)} m).
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

      <section className="sheet flex flex-col gap-3" aria-labelledby="weighins-title">
        <h2 id="weighins-title" className="heading-bar self-start text-lg">
          Weigh-ins
        </h2>
        <FineGoldLine find={find} latestAir={latest?.input.airGrams ?? []} unit={settings.massUnit} />
        {(weighIns ?? []).length === 0 && <p className="text-ink-soft">Not weighed yet.</p>}
        <ul className="flex flex-col gap-2" data-testid="weigh-ins">
          {(weighIns ?? []).map((w) => (
            <li key={w.id} className="flex flex-wrap items-baseline justify-between gap-2 border-b border-rule pb-2">
              <span>
                {formatWhen(w.weighedAt)} · {w.input.method} · {w.input.waterTempC ?? 20} °C
              </span>
              <span className="figure font-bold">
                ≈ {formatGrams(w.deviceEstimate.fineGoldGrams, settings.massUnit, w.deviceEstimate.standardUncertainty.fineGoldGrams)} fine (at worst{" "}
                {formatGrams(w.deviceEstimate.range.fineGoldGrams[0], settings.massUnit, w.deviceEstimate.standardUncertainty.fineGoldGrams)} –{" "}
                {formatGrams(w.deviceEstimate.range.fineGoldGrams[1], settings.massUnit, w.deviceEstimate.standardUncertainty.fineGoldGrams)})
              </span>
              <span className="w-full text-xs text-ink-soft" data-testid="weigh-in-engine">
                {engineLabel(w.deviceEstimate.engineVersion)}
              </span>
              <ScaleLine scaleCheck={w.scaleCheck} scaleName={scales?.find((x) => x.id === w.scaleId)?.name ?? (w.scaleId ? "a removed scale" : null)} />
              <button
                type="button"
                className="btn px-2 text-sm"
                onClick={async () => {
                  await deleteWeighIn(db, w.id);
                  requestSync();
                }}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
        {weighing ? (
          <Suspense fallback={<Skeleton />}>
            <WeighInFlow
              claim={claimGoldOf(claims.find((c) => c.id === find.claimId))}
              initial={{ resolution: settings.scaleResolution, hostPreset: settings.hostPreset, finenessPreset: settings.finenessPreset, tempUnit: settings.tempUnit, readingUnit: "g" }}
              scales={scales ?? []}
              onSave={async (input, estimate, scale) => {
                await saveWeighIn(db, { id: newId(), findId: find.id, input, deviceEstimate: estimate, weighedAt: Date.now(), ...scale });
                setWeighing(false);
                requestSync();
              }}
            />
          </Suspense>
        ) : (
          <button type="button" className="btn btn-primary self-start" onClick={() => setWeighing(true)}>
            Weigh this specimen
          </button>
        )}
        <p className="text-sm text-ink-soft">Estimates are not assays.</p>
      </section>

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
