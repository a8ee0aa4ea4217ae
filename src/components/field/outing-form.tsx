"use client";
import { useForm } from "react-hook-form";
import type { LocalOuting } from "@/client/device-db";
import { FieldError } from "@/components/field-error";
import { parseTyped } from "@/lib/parse-number";
import type { ClaimView } from "@/lib/entities/claim";
import type { Outing } from "@/lib/entities/outing";
import { toLocalInput } from "@/lib/format";
import type { OutingFormValues } from "./form-schemas";
import { lazyZodResolver } from "./lazy-resolver";
import { ClaimOptions, MethodOptions } from "./options";

type Props = { outing: LocalOuting; claims: ClaimView[]; onSave: (outing: Outing) => Promise<void> };

/** An outing's details, editable; the shared outing schema checks them again on save. */
export function OutingForm({ outing, claims, onSave }: Props) {
  const { register, handleSubmit, formState, setError } = useForm<OutingFormValues>({
    resolver: lazyZodResolver(async () => (await import("./form-schemas")).outingFormSchema),
    // A sync can update the record while the member types: keep what they have changed.
    resetOptions: { keepDirtyValues: true },
    values: {
      claimId: outing.claimId ?? "",
      method: outing.method,
      startedAt: toLocalInput(outing.startedAt),
      endedAt: outing.endedAt ? toLocalInput(outing.endedAt) : "",
      hours: outing.hours == null ? "" : String(outing.hours),
      companions: outing.companions,
      conditions: outing.conditions,
      notes: outing.notes,
    },
  });
  const e = formState.errors;

  const submit = handleSubmit(async (v) => {
    try {
      await onSave({
        id: outing.id,
        claimId: v.claimId || null,
        method: v.method,
        startedAt: new Date(v.startedAt).getTime(),
        endedAt: v.endedAt ? new Date(v.endedAt).getTime() : null,
        hours: parseTyped(v.hours) ?? null,
        companions: v.companions,
        conditions: v.conditions,
        notes: v.notes,
      });
    } catch (error) {
      const fields = (error as { fields?: Record<string, string[]> }).fields;
      if (!fields) throw error;
      for (const [k, msgs] of Object.entries(fields)) setError(k as keyof OutingFormValues, { message: msgs[0] });
    }
  });

  return (
    <form onSubmit={submit} className="sheet grid grid-cols-2 gap-3" noValidate aria-label="Outing details">
      <label className="col-span-2 flex flex-col">
        <span className="field-label">Claim</span>
        <select className="field-input" {...register("claimId")}>
          <option value="">Off the club&apos;s claims</option>
          <ClaimOptions claims={claims} current={outing.claimId} />
        </select>
      </label>
      <label className="flex flex-col">
        <span className="field-label">Method</span>
        <select className="field-input" {...register("method")}>
          <MethodOptions />
        </select>
      </label>
      <label className="flex flex-col">
        <span className="field-label">Hours</span>
        <input inputMode="decimal" className="field-input figure" aria-invalid={!!e.hours} {...register("hours")} />
        <FieldError messages={e.hours?.message ? [e.hours.message] : undefined} />
      </label>
      <label className="flex flex-col">
        <span className="field-label">Started</span>
        <input type="datetime-local" className="field-input" {...register("startedAt")} />
        <FieldError messages={e.startedAt?.message ? [e.startedAt.message] : undefined} />
      </label>
      <label className="flex flex-col">
        <span className="field-label">Ended</span>
        <input type="datetime-local" className="field-input" aria-invalid={!!e.endedAt} {...register("endedAt")} />
        <FieldError messages={e.endedAt?.message ? [e.endedAt.message] : undefined} />
      </label>
      <label className="col-span-2 flex flex-col">
        <span className="field-label">With</span>
        <input className="field-input" {...register("companions")} />
      </label>
      <label className="col-span-2 flex flex-col">
        <span className="field-label">Conditions</span>
        <input className="field-input" {...register("conditions")} placeholder="weather, ground, water" />
      </label>
      <label className="col-span-2 flex flex-col">
        <span className="field-label">Notes</span>
        <textarea rows={3} className="field-input" {...register("notes")} />
      </label>
      <button type="submit" className="btn btn-primary col-span-2">
        Save the outing
      </button>
    </form>
  );
}
