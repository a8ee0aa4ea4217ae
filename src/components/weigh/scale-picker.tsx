"use client";
import type { UseFormRegister, UseFormSetValue } from "react-hook-form";
import type { Scale } from "@/lib/entities/scale";
import { convertMass } from "@/lib/estimate/units";
import { latestCheck } from "@/lib/figures/scale-standing";
import { formatWhen } from "@/lib/format";
import type { WeighFormValues } from "./form-model";

/** The scale's last setup check in a line: passed or failed, when, how far off. */
export function CheckStanding({ scale }: { scale: Pick<Scale, "checks"> }) {
  const c = latestCheck(scale);
  if (!c) return <span data-standing="unchecked">Never checked: run a setup check to prove this rig.</span>;
  const off = `${c.result.differencePercent >= 0 ? "+" : "−"}${Math.abs(c.result.differencePercent).toFixed(1)} %`;
  return c.result.passed ? (
    <span data-standing="passed" className="text-moss">
      Last setup check passed ({formatWhen(c.checkedAt)}, {off} off the reference).
    </span>
  ) : (
    <span data-standing="failed" className="font-bold text-rust">
      Last setup check failed ({formatWhen(c.checkedAt)}, {off} off the reference).
    </span>
  );
}

/**
 * The member's scale profiles: choosing one fills in its step and accuracy (in the reading
 * unit), and a weigh-in made with it records it and its latest check.
 */
export function ScalePicker({
  scales,
  register,
  setValue,
  scaleId,
  unit,
}: {
  scales: Scale[];
  register: UseFormRegister<WeighFormValues>;
  setValue: UseFormSetValue<WeighFormValues>;
  scaleId: string;
  unit: WeighFormValues["readingUnit"];
}) {
  const chosen = scales.find((s) => s.id === scaleId);
  const fill = (id: string, u = unit) => {
    const s = scales.find((x) => x.id === id);
    if (!s) return;
    const inUnit = (g: number) => String(Number(convertMass(g, u).toPrecision(6)));
    setValue("resolution", inUnit(s.stepGrams));
    setValue("accuracy", s.accuracyGrams === null ? "" : inUnit(s.accuracyGrams));
  };
  return (
    <div className="flex flex-col gap-1">
      <label className="flex flex-col">
        <span className="field-label">Scale</span>
        <select className="field-input" {...register("scaleId", { onChange: (e) => fill(e.target.value) })}>
          <option value="">Not one of my scales (type its step)</option>
          {scales.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name} — step {s.stepGrams} g
            </option>
          ))}
        </select>
      </label>
      {chosen && (
        <p className="text-sm" data-testid="scale-standing">
          <CheckStanding scale={chosen} />
        </p>
      )}
    </div>
  );
}

/** Above an estimate made on a scale whose last check failed. */
export function FailedCheckNotice({ scale }: { scale: Pick<Scale, "name" | "checks"> }) {
  const c = latestCheck(scale);
  if (!c || c.result.passed) return null;
  return (
    <p role="alert" className="sheet border-2 border-rust font-bold text-rust" data-testid="scale-check-failed">
      {scale.name}&apos;s last setup check ({formatWhen(c.checkedAt)}) failed: the rig read {Math.abs(c.result.differencePercent).toFixed(1)} %{" "}
      {c.result.difference > 0 ? "heavy" : "light"}. Find the fault (a wet line tared dry, a bubble, the basket touching the cup, a drifting scale) and check
      again before you trust this estimate.
    </p>
  );
}
