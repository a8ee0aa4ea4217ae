"use client";
import { useQueryOnceCopied } from "@/client/first-copy";
import { IntentLink } from "@/components/intent-link";
import { lazy, Suspense, useMemo, useState, type ReactElement } from "react";
import { useClaims, useSettings } from "@/client/hooks";
import type { LocalFind } from "@/client/device-db";
import { useMember } from "@/client/member";
import { useQueryStates } from "@/client/query-states";
import { FIND_KINDS, KIND_LABELS } from "@/lib/entities/constants";
import { countOf, formatDay, formatGrams } from "@/lib/format";
import { Skeleton } from "../skeleton";
import { ClaimOptions } from "../options";
import { QueryMark } from "../query-mark";

const ROW_HEIGHT = 76;
/** Rows drawn plainly while the list's virtualiser loads: more than a phone's screen holds. */
const FIRST_SCREEN = 12;

// The virtualiser loads just after the screen; the first rows show at once without it.
type VirtualRowsProps = { data: LocalFind[]; itemSize: number; firstCount: number; children: (f: LocalFind) => ReactElement };
const VirtualRows = lazy(() => import("../virtual-rows").then((m) => ({ default: m.VirtualRows as (p: VirtualRowsProps) => ReactElement })));

/** The member's own finds: search, filter, and a list that stays quick with thousands. */
export function FindsListScreen() {
  const { db } = useMember();
  const loaded = useClaims(db);
  const claims = useMemo(() => loaded ?? [], [loaded]);
  const settings = useSettings(db);
  const all = useQueryOnceCopied(db, () => db.finds.orderBy("foundAt").reverse().toArray(), []);
  const queries = useQueryStates(db);
  const [text, setText] = useState("");
  const [kind, setKind] = useState("");
  const [claim, setClaim] = useState("");
  const claimName = useMemo(() => new Map(claims.map((c) => [c.id, c.name])), [claims]);

  const shown = useMemo(() => {
    const q = text.trim().toLowerCase();
    return (all ?? []).filter(
      (f) =>
        (!kind || f.kind === kind) &&
        (!claim || (claim === "none" ? f.claimId === null : f.claimId === claim)) &&
        (!q || `${f.notes} ${f.kind} ${claimName.get(f.claimId ?? "") ?? ""}`.toLowerCase().includes(q)),
    );
  }, [all, text, kind, claim, claimName]);

  const row = (f: LocalFind) => (
    <div key={f.id} style={{ height: ROW_HEIGHT }} className="pb-2">
      <IntentLink href={`/finds/view#id=${f.id}`} className="sheet flex h-full items-center justify-between gap-2 no-underline">
        <span>
          <span className="font-bold">{KIND_LABELS[f.kind]}</span> <QueryMark state={queries?.get(f.id)} />
          <span className="block text-sm text-ink-soft">
            {claimName.get(f.claimId ?? "") ?? "off-claim"} · {formatDay(f.foundAt)}
          </span>
        </span>
        <span className="figure font-bold">{f.weightGrams != null ? formatGrams(f.weightGrams, settings.massUnit) : "—"}</span>
      </IntentLink>
    </div>
  );

  return (
    <>
      <div className="grid grid-cols-1 gap-2 sm:grid-cols-3" role="search">
        <label className="flex flex-col">
          <span className="field-label">Search</span>
          <input type="search" className="field-input" value={text} onChange={(e) => setText(e.target.value)} placeholder="notes, claim, kind" />
        </label>
        <label className="flex flex-col">
          <span className="field-label">Kind</span>
          <select className="field-input" value={kind} onChange={(e) => setKind(e.target.value)}>
            <option value="">All kinds</option>
            {FIND_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_LABELS[k]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col">
          <span className="field-label">Claim</span>
          <select className="field-input" value={claim} onChange={(e) => setClaim(e.target.value)}>
            <option value="">All claims</option>
            <ClaimOptions claims={claims} />
            <option value="none">Off the club&apos;s claims</option>
          </select>
        </label>
      </div>
      {all === undefined ? (
        <Skeleton />
      ) : (
        <>
          <p className="text-sm text-ink-soft" data-testid="finds-count">
            {shown.length} of {countOf(all.length, "find", "finds")}
          </p>
          <div className="max-h-[70dvh] overflow-auto" data-testid="finds-list">
            <Suspense
              fallback={
                <ul>
                  {shown.slice(0, FIRST_SCREEN).map((f) => (
                    <li key={f.id}>{row(f)}</li>
                  ))}
                </ul>
              }
            >
              <VirtualRows data={shown} itemSize={ROW_HEIGHT} firstCount={FIRST_SCREEN}>
                {row}
              </VirtualRows>
            </Suspense>
          </div>
        </>
      )}
    </>
  );
}
