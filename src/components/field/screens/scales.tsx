"use client";
import { useQueryOnceCopied } from "@/client/first-copy";
import { lazy, Suspense, useState } from "react";
import { addSetupCheck, deleteScale, newId, saveScale } from "@/client/logbook";
import type { LocalScale } from "@/client/device-db";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import { defaultScaleAccuracy } from "@/lib/estimate/defaults";
import { formatWhen } from "@/lib/format";
import { parseNumber } from "@/lib/parse-number";
import { CheckStanding } from "@/components/weigh/scale-picker";
import { compareNames } from "@/lib/text/compare-names";
import { Skeleton } from "../skeleton";

// The check flow (and the engine with it) loads when the member starts a check.
const SetupCheckFlow = lazy(() => import("@/components/weigh/setup-check-flow").then((m) => ({ default: m.SetupCheckFlow })));

function ScaleCard({ scale }: { scale: LocalScale }) {
  const { db } = useMember();
  const [checking, setChecking] = useState(false);
  const accuracy = scale.accuracyGrams ?? defaultScaleAccuracy(scale.stepGrams);
  const history = [...scale.checks].sort((a, b) => b.checkedAt - a.checkedAt);
  return (
    <li className="sheet flex flex-col gap-2" aria-label={scale.name} data-testid="scale">
      <h2 className="text-lg font-bold">{scale.name}</h2>
      <p className="figure text-sm">
        Step {scale.stepGrams} g · ± {accuracy} g a reading{scale.accuracyGrams === null ? " (the usual for this step)" : " (as stated)"}
      </p>
      <p className="text-sm">
        <CheckStanding scale={scale} />
      </p>
      {history.length > 0 && (
        <details>
          <summary className="cursor-pointer text-sm font-bold">Setup checks ({history.length})</summary>
          <ul className="text-sm" data-testid="check-history">
            {history.map((c) => (
              <li key={c.id} className="border-b border-rule py-1" data-passed={c.result.passed}>
                {formatWhen(c.checkedAt)} · {c.reference.label} ·{" "}
                <strong className={c.result.passed ? "text-moss" : "text-rust"}>{c.result.passed ? "passed" : "failed"}</strong> ·{" "}
                <span className="figure">{c.result.measuredDensity.toFixed(3)}</span> for <span className="figure">{c.reference.density} g/cm³</span>{" "}
                <span className="figure">
                  ({c.result.differencePercent >= 0 ? "+" : "−"}
                  {Math.abs(c.result.differencePercent).toFixed(2)} %)
                </span>
              </li>
            ))}
          </ul>
        </details>
      )}
      {checking ? (
        <Suspense fallback={<Skeleton />}>
          <SetupCheckFlow
            scale={scale}
            onSave={async (check) => {
              await addSetupCheck(db, scale.id, check);
              setChecking(false);
              requestSync();
            }}
          />
          <button type="button" className="btn self-start" onClick={() => setChecking(false)}>
            Cancel the check
          </button>
        </Suspense>
      ) : (
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn btn-primary" onClick={() => setChecking(true)}>
            Run a setup check
          </button>
          <button
            type="button"
            className="btn border-rust text-rust"
            onClick={async () => {
              if (!window.confirm(`Remove ${scale.name}? Weigh-ins made on it keep what its check said then.`)) return;
              await deleteScale(db, scale.id);
              requestSync();
            }}
          >
            Remove
          </button>
        </div>
      )}
    </li>
  );
}

function AddScale() {
  const { db } = useMember();
  const [name, setName] = useState("");
  const [step, setStep] = useState("0.01");
  const [accuracy, setAccuracy] = useState("");
  const [error, setError] = useState<string | null>(null);
  const stepGrams = parseNumber(step);
  const hint = stepGrams !== undefined && stepGrams > 0 ? `± ${Number(defaultScaleAccuracy(stepGrams).toPrecision(2))} g` : "";
  return (
    <form
      className="sheet grid gap-3 sm:grid-cols-3"
      aria-label="Add a scale"
      onSubmit={async (e) => {
        e.preventDefault();
        const acc = parseNumber(accuracy);
        if (stepGrams === undefined || Number.isNaN(stepGrams)) return setError("Type the scale's step in grams, like 0.01.");
        if (acc !== undefined && Number.isNaN(acc)) return setError("Type the accuracy in grams, or leave it blank.");
        try {
          await saveScale(db, { id: newId(), name: name.trim() || `Scale ${step} g`, stepGrams, accuracyGrams: acc ?? null, checks: [] });
          setName("");
          setAccuracy("");
          setError(null);
          requestSync();
        } catch (err) {
          setError(err instanceof Error ? err.message : String(err));
        }
      }}
    >
      <h2 className="heading-bar self-start text-lg sm:col-span-3">Add a scale</h2>
      <label className="flex flex-col">
        <span className="field-label">Name</span>
        <input className="field-input" value={name} onChange={(e) => setName(e.target.value)} placeholder="Pocket scale" />
      </label>
      <label className="flex flex-col">
        <span className="field-label">Step (g)</span>
        <input inputMode="decimal" className="field-input figure" value={step} onChange={(e) => setStep(e.target.value)} />
      </label>
      <label className="flex flex-col">
        <span className="field-label">Accuracy ± (g)</span>
        <input inputMode="decimal" className="field-input figure" value={accuracy} placeholder={hint} onChange={(e) => setAccuracy(e.target.value)} />
      </label>
      <p className="text-sm text-ink-soft sm:col-span-3">
        The accuracy is how far one reading may be off, from the scale&apos;s specification (repeatability and linearity). Left blank: {hint || "a default"} for
        this step.
      </p>
      {error && <p className="field-error sm:col-span-3">{error}</p>}
      <button type="submit" className="btn btn-primary self-start">
        Add the scale
      </button>
    </form>
  );
}

/** The member's scale profiles: step, accuracy, and the history of their setup checks. */
export function ScalesScreen() {
  const { db } = useMember();
  const scales = useQueryOnceCopied(db, () => db.scales.toArray().then((s) => s.sort((a, b) => compareNames(a.name, b.name))), []);
  return (
    <>
      {scales === undefined ? (
        <Skeleton />
      ) : scales.length === 0 ? (
        <p>No scales yet: add the one you weigh with.</p>
      ) : (
        <ul className="flex flex-col gap-3">
          {scales.map((s) => (
            <ScaleCard key={s.id} scale={s} />
          ))}
        </ul>
      )}
      {/* With the list: drawn below a placeholder, the form would jump when the list replaced it. */}
      {scales !== undefined && <AddScale />}
    </>
  );
}
