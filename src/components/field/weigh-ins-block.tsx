"use client";
import { useLiveQuery } from "@/client/live-query";
import { lazy, Suspense, useState } from "react";
import type { LocalFind, LocalWeighIn, LodebookDb } from "@/client/device-db";
import { deleteWeighIn, newId, saveWeighIn } from "@/client/logbook";
import type { MemberSettings } from "@/client/settings";
import { requestSync } from "@/client/sync/scheduler";
import type { ClaimView } from "@/lib/entities/claim";
import type { MassUnit } from "@/lib/estimate/units";
import { claimGoldOf } from "@/lib/figures/claim-gold";
import { FINE_BASIS_LABELS, weighMismatch } from "@/lib/figures/fine-basis";
import { formatGrams, formatWhen } from "@/lib/format";
import { engineLabel } from "@/components/weigh/engine-label";
import { Skeleton } from "./skeleton";

// The weigh-in flow (and the estimate engine with it) loads when the member starts weighing.
const WeighInFlow = lazy(() => import("@/components/weigh/weigh-in-flow").then((m) => ({ default: m.WeighInFlow })));

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
  if (!scaleCheck)
    return (
      <span className="w-full text-xs text-ink-soft" data-testid="weigh-in-scale" data-standing="unchecked">
        On {scaleName}, not checked then.
      </span>
    );
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

/**
 * A find's weigh-ins on the phone: its fine gold as the club figured it, each weigh-in with its
 * estimate, engine and scale, and the weigh-in flow. Loaded just after the find's record.
 */
export function WeighInsBlock({
  db,
  find,
  weighIns,
  claims,
  settings,
}: {
  db: LodebookDb;
  find: LocalFind;
  weighIns: LocalWeighIn[] | undefined;
  claims: ClaimView[];
  settings: MemberSettings;
}) {
  const scales = useLiveQuery(() => db.scales.toArray(), [db]);
  const [weighing, setWeighing] = useState(false);
  const latest = weighIns?.[weighIns.length - 1];
  return (
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
            initial={{
              resolution: settings.scaleResolution,
              hostPreset: settings.hostPreset,
              finenessPreset: settings.finenessPreset,
              tempUnit: settings.tempUnit,
              readingUnit: "g",
            }}
            scales={scales ?? []}
            onSave={async (input, estimate, scale) => {
              await saveWeighIn(db, { id: newId(), findId: find.id, input, deviceEstimate: estimate, weighedAt: Date.now(), ...scale });
              setWeighing(false);
              requestSync();
            }}
            onCancel={() => setWeighing(false)}
          />
        </Suspense>
      ) : (
        <button type="button" className="btn btn-primary self-start" onClick={() => setWeighing(true)}>
          Weigh this specimen
        </button>
      )}
      <p className="text-sm text-ink-soft">Estimates are not assays.</p>
    </section>
  );
}
