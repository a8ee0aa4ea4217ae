"use client";
import { useLiveQuery } from "dexie-react-hooks";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { useClaims, useHashParams } from "@/client/hooks";
import { deleteOuting, endOuting, saveOuting, stripLocal } from "@/client/logbook";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import { FieldError } from "@/components/field-error";
import { parseNumber } from "@/components/weigh/form-model";
import { KIND_LABELS } from "@/lib/entities/constants";
import { formatWhen, toLocalInput } from "@/lib/format";
import type { OutingFormValues } from "../form-schemas";
import { lazyZodResolver } from "../lazy-resolver";
import { Skeleton } from "../skeleton";
import { ClaimOptions, MethodOptions } from "../options";


type OutingForm = OutingFormValues;

export function OutingDetailScreen() {
  const id = useHashParams().get("id") ?? "";
  const { db } = useMember();
  const router = useRouter();
  const claims = useClaims(db) ?? [];
  const outing = useLiveQuery(async () => (await db.outings.get(id)) ?? null, [db, id]);
  const finds = useLiveQuery(() => db.finds.where("outingId").equals(id).toArray(), [db, id]);
  const { register, handleSubmit, formState, setError } = useForm<OutingForm>({
    resolver: lazyZodResolver(async () => (await import("../form-schemas")).outingFormSchema),
    // A sync can update the record while the member types: keep what they have changed.
    resetOptions: { keepDirtyValues: true },
    values: outing
      ? {
          claimId: outing.claimId ?? "",
          method: outing.method,
          startedAt: toLocalInput(outing.startedAt),
          endedAt: outing.endedAt ? toLocalInput(outing.endedAt) : "",
          hours: outing.hours == null ? "" : String(outing.hours),
          companions: outing.companions,
          conditions: outing.conditions,
          notes: outing.notes,
        }
      : undefined,
  });
  if (outing === undefined) return <Skeleton />;
  if (outing === null) return <p className="sheet">This outing is not on this device.</p>;
  const e = formState.errors;

  const submit = handleSubmit(async (v) => {
    try {
      await saveOuting(db, {
        id: outing.id,
        claimId: v.claimId || null,
        method: v.method,
        startedAt: new Date(v.startedAt).getTime(),
        endedAt: v.endedAt ? new Date(v.endedAt).getTime() : null,
        hours: parseNumber(v.hours) ?? null,
        companions: v.companions,
        conditions: v.conditions,
        notes: v.notes,
      });
      requestSync();
    } catch (error) {
      const fields = (error as { fields?: Record<string, string[]> }).fields;
      if (!fields) throw error;
      for (const [k, msgs] of Object.entries(fields)) setError(k as keyof OutingForm, { message: msgs[0] });
    }
  });

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
      <form onSubmit={submit} className="sheet grid grid-cols-2 gap-3" noValidate aria-label="Outing details">
        <label className="col-span-2 flex flex-col">
          <span className="field-label">Claim</span>
          <select className="field-input" {...register("claimId")}>
            <option value="">Off the club&apos;s claims</option>
            <ClaimOptions claims={claims} />
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
      <section className="flex flex-col gap-2">
        <h2 className="heading-bar self-start text-lg">Finds on this outing</h2>
        {(finds ?? []).map((f) => (
          <Link key={f.id} className="sheet no-underline" href={`/finds/view#id=${f.id}`}>
            {KIND_LABELS[f.kind]} · {formatWhen(f.foundAt)}
          </Link>
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
