"use client";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { useEffect, useMemo, useRef, useState } from "react";
import { REVIEW_STATES, type LedgerPage, type LedgerRow, type LedgerSummary } from "@/lib/club/ledger";
import { FINE_BASIS_LABELS, type FineBasis } from "@/lib/figures/fine-basis";
import { FIND_KINDS, KIND_LABELS } from "@/lib/entities/constants";
import { formatGrams } from "@/lib/format";
import { api } from "./api";
import { FindPanel } from "./find-panel";
import { MassTotal } from "./report-parts";

type Option = { id: string; name: string | null };
const col = createColumnHelper<LedgerRow>();
const grams = (g: number | null) => (g == null ? "—" : formatGrams(g));
const money = (v: number | null, c: string | null) => (v == null ? "—" : `${v.toFixed(2)} ${c ?? ""}`);
const STATE_LABEL = { new: "New", verified: "Verified", queried: "Queried", answered: "Answered" } as const;

const SORT_IDS: Record<string, string> = {
  foundAt: "foundAt",
  memberName: "member",
  claimName: "claim",
  kind: "kind",
  method: "method",
  weightGrams: "weight",
  fineGrams: "fine",
  value: "value",
  state: "state",
};

/** A find's fine gold, how it was reached, its range, and a flag when its weigh-in disagrees with its weight. */
function FineCell({ row }: { row: LedgerRow }) {
  if (row.fineGrams == null) return <span className="text-ink-soft">{row.kind === "specimen" ? "not weighed" : "no weight"}</span>;
  return (
    <span className="flex flex-col">
      <span className="figure">{grams(row.fineGrams)}</span>
      <span className="text-xs text-ink-soft">
        {row.fineBasis ? FINE_BASIS_LABELS[row.fineBasis] : ""}
        {row.fineLow !== row.fineHigh && (
          <>
            {" · "}
            <span className="whitespace-nowrap">
              {grams(row.fineLow)}–{grams(row.fineHigh)}
            </span>
          </>
        )}
      </span>
      {row.fineBasis === "weighed" && row.scaleChecked !== null && (
        <span className={`text-xs ${row.scaleChecked ? "text-moss" : "font-bold text-rust"}`} data-testid="scale-checked" data-checked={row.scaleChecked}>
          {row.scaleChecked ? "on a checked scale" : "scale not checked"}
        </span>
      )}
      {row.weighMismatch && (
        <span className="text-xs font-bold text-rust" data-testid="weigh-mismatch">
          weigh-in ≠ recorded weight
        </span>
      )}
    </span>
  );
}

/** "12 by claim fineness, 5 weighed specimens…", and the finds with no figure. */
function basisSummary(s: LedgerSummary): string {
  const parts = (Object.entries(s.byBasis) as [FineBasis, number][]).map(([b, n]) => `${n} by ${FINE_BASIS_LABELS[b]}`);
  const none = s.finds - s.figured;
  if (none > 0) parts.push(`${none} without a figure (specimens not weighed, no weight)`);
  return parts.length ? `Fine gold: ${parts.join(", ")}` : "No finds";
}

/** The officers' club ledger: filtered and paged on the server, totals for everything selected. */
export function LedgerScreen({
  claims,
  members,
  seasons,
  first,
}: {
  claims: Option[];
  members: Option[];
  seasons: number[];
  first?: { query: string; page: LedgerPage };
}) {
  const params = useSearchParams();
  const router = useRouter();
  const pathname = usePathname();
  const [openId, setOpenId] = useState<string | null>(null);
  const query = params.toString();
  const { data, error, isFetching } = useQuery({
    queryKey: ["ledger", query],
    queryFn: () => api<LedgerPage>(`/api/club/ledger?${query}`),
    placeholderData: keepPreviousData,
    // The page the server rendered with the screen, for the address it was rendered for.
    initialData: first && first.query === query ? first.page : undefined,
  });

  // The filters as last asked for: several quick changes all count, even before the address
  // bar catches up; back and forward reset it.
  const latest = useRef<string | null>(null);
  useEffect(() => {
    const reset = () => (latest.current = null);
    window.addEventListener("popstate", reset);
    return () => window.removeEventListener("popstate", reset);
  }, []);
  const set = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(latest.current ?? window.location.search);
    for (const [k, v] of Object.entries(changes)) {
      if (v) next.set(k, v);
      else next.delete(k);
    }
    if (!("page" in changes)) next.delete("page");
    latest.current = next.toString();
    router.replace(`${pathname}?${next}`, { scroll: false });
  };

  const sorting: SortingState = [
    { id: Object.entries(SORT_IDS).find(([, v]) => v === (params.get("sort") ?? "foundAt"))?.[0] ?? "foundAt", desc: (params.get("dir") ?? "desc") === "desc" },
  ];
  const columns = useMemo(
    () => [
      col.accessor("foundAt", { header: "Found", cell: (c) => <span className="whitespace-nowrap">{c.row.original.foundOn}</span> }),
      col.accessor("memberName", { header: "Member" }),
      col.accessor("claimName", {
        header: "Claim",
        cell: (c) => (
          <span className="flex flex-col">
            <span>{c.getValue() ?? "off-claim"}</span>
            {c.row.original.outsideClaim && (
              <span className="text-xs font-bold text-rust" data-testid="outside-claim">
                position outside it
              </span>
            )}
          </span>
        ),
      }),
      col.accessor("kind", {
        header: "Kind",
        cell: (c) => (
          <span className="flex flex-col">
            <span>{KIND_LABELS[c.getValue() as keyof typeof KIND_LABELS]}</span>
            {/* With the find panel open the Method column steps aside: its word goes here. */}
            {c.table.getColumn("method")?.getIsVisible() === false && <span className="text-xs text-ink-soft">{c.row.original.method}</span>}
          </span>
        ),
      }),
      col.accessor("method", { header: "Method" }),
      col.accessor("weightGrams", { header: "Weight", cell: (c) => <span className="figure">{grams(c.getValue())}</span> }),
      col.accessor("fineGrams", {
        header: "Fine gold (est.)",
        cell: (c) => <FineCell row={c.row.original} />,
      }),
      col.accessor("value", { header: "Value", cell: (c) => <span className="figure">{money(c.getValue(), c.row.original.currency)}</span> }),
      col.accessor("state", {
        header: "Review",
        cell: (c) => (
          <span className="flex flex-col">
            <span data-state={c.getValue()} className={c.getValue() === "answered" ? "font-bold" : ""}>
              {STATE_LABEL[c.getValue()]}
            </span>
            {c.row.original.changedSinceQuery && (
              <span className="text-xs font-bold text-rust" data-testid="changed-since-query">
                changed since the query
              </span>
            )}
          </span>
        ),
      }),
    ],
    [],
  );
  const table = useReactTable({
    data: data?.rows ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    // With the find panel beside it, the table drops Method and Weight (both are in the panel)
    // so a laptop shows every other column without sideways scrolling.
    state: { sorting, columnVisibility: { method: !openId, weightGrams: !openId } },
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const first = next[0];
      set({ sort: first ? SORT_IDS[first.id] : undefined, dir: first ? (first.desc ? "desc" : "asc") : undefined });
    },
  });

  const page = data?.page ?? 1;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const s = data?.summary;
  const select = (name: string, label: string, options: [string, string][], all: string) => (
    <label className="flex flex-col text-sm">
      <span className="font-bold">{label}</span>
      <select className="field-input" value={params.get(name) ?? ""} onChange={(e) => set({ [name]: e.target.value || undefined })}>
        <option value="">{all}</option>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    </label>
  );

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-2">
        <h1 className="text-2xl font-bold">Club ledger</h1>
        <div className="flex gap-2">
          <a className="btn" href={`/api/club/ledger/csv?${query}`} download>
            Export CSV
          </a>
          <a className="btn" href={`/api/club/ledger/geojson?${query}`} download>
            Export GeoJSON
          </a>
          <a className="btn" href={`/club/report?${query}`}>
            Printable report
          </a>
          {params.get("claimId") && (
            <a className="btn" href={`/club/report?${query}&form=landowner`}>
              Landowner&apos;s statement
            </a>
          )}
        </div>
      </div>
      <form className="sheet grid grid-cols-[repeat(auto-fill,minmax(10rem,1fr))] gap-2" aria-label="Ledger filters" onSubmit={(e) => e.preventDefault()}>
        {select(
          "claimId",
          "Claim",
          claims.map((c) => [c.id, c.name ?? ""]),
          "All claims",
        )}
        {select(
          "memberId",
          "Member",
          members.map((m) => [m.id, m.name ?? ""]),
          "All members",
        )}
        {select(
          "season",
          "Season",
          seasons.map((y) => [String(y), String(y)]),
          "Any season",
        )}
        <label className="flex flex-col text-sm">
          <span className="font-bold">From</span>
          <input type="date" className="field-input" value={params.get("from") ?? ""} onChange={(e) => set({ from: e.target.value || undefined })} />
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-bold">To</span>
          <input type="date" className="field-input" value={params.get("to") ?? ""} onChange={(e) => set({ to: e.target.value || undefined })} />
        </label>
        {select(
          "kind",
          "Kind",
          FIND_KINDS.map((k) => [k, KIND_LABELS[k]]),
          "All kinds",
        )}
        {select("state", "Review", [...REVIEW_STATES.map((k): [string, string] => [k, STATE_LABEL[k]]), ["changed", "Changed since the query"]], "Any state")}
        {select("price", "Value at", [["today", "today's price"]], "the find's date")}
      </form>
      {error && <p className="field-error">{(error as Error).message}</p>}

      {s && (
        <section aria-label="Totals" className="sheet grid grid-cols-[repeat(auto-fit,minmax(12rem,1fr))] gap-3" data-testid="ledger-totals">
          <div>
            <p className="text-sm text-ink-soft">Finds</p>
            <p className="figure text-xl font-bold" data-testid="total-finds">
              {s.finds}
            </p>
          </div>
          <div>
            <p className="text-sm text-ink-soft">Recorded weight</p>
            <MassTotal grams={s.weightGrams} />
          </div>
          <div>
            <p className="text-sm text-ink-soft">Fine gold (est.)</p>
            <MassTotal grams={s.fineGrams} low={s.fineLow} high={s.fineHigh} testId="total-fine" />
          </div>
          <div>
            <p className="text-sm text-ink-soft">Value</p>
            <p className="figure text-xl font-bold">{money(s.value, s.currency)}</p>
            <p className="text-sm text-ink-soft tabular-nums">
              at worst <span className="whitespace-nowrap">{money(s.valueLow, s.currency)}</span> –{" "}
              <span className="whitespace-nowrap">{money(s.valueHigh, s.currency)}</span>
            </p>
          </div>
          <p className="col-span-full text-xs text-ink-soft" data-testid="ledger-bases">
            {basisSummary(s)}. {s.mismatched > 0 ? `${s.mismatched} weigh-in${s.mismatched === 1 ? "" : "s"} far from the find's weight. ` : ""}Estimates, not
            assays.
          </p>
        </section>
      )}

      <div className={`grid gap-4 ${openId ? "xl:grid-cols-[minmax(0,1fr)_26rem]" : ""}`}>
        <div className="sheet overflow-x-auto" aria-busy={isFetching}>
          <table className="w-full text-left text-sm" data-testid="ledger-table">
            <thead>
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id} className="border-b-2 border-rule">
                  {hg.headers.map((h) => (
                    <th
                      key={h.id}
                      className="whitespace-nowrap py-2 pr-3 align-bottom"
                      aria-sort={h.column.getIsSorted() ? (h.column.getIsSorted() === "desc" ? "descending" : "ascending") : undefined}
                    >
                      {h.column.getCanSort() ? (
                        <button type="button" className="font-bold underline-offset-2 hover:underline" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          {h.column.getIsSorted() === "desc" ? " ↓" : h.column.getIsSorted() === "asc" ? " ↑" : ""}
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  ))}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr
                  key={row.id}
                  className={`cursor-pointer border-b border-rule hover:bg-paper ${openId === row.original.id ? "bg-paper" : ""}`}
                  onClick={() => setOpenId(row.original.id)}
                  data-find={row.original.id}
                >
                  {row.getVisibleCells().map((cell, i) => (
                    <td key={cell.id} className="py-2 pr-3 align-top tabular-nums">
                      {i === 0 ? (
                        <button type="button" className="underline" onClick={() => setOpenId(row.original.id)}>
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </button>
                      ) : (
                        flexRender(cell.column.columnDef.cell, cell.getContext())
                      )}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
          <div className="mt-3 flex items-center gap-2">
            <button type="button" className="btn" disabled={page <= 1} onClick={() => set({ page: String(page - 1) })}>
              Previous
            </button>
            <span className="text-sm">
              Page {page} of {pages}
            </span>
            <button type="button" className="btn" disabled={page >= pages} onClick={() => set({ page: String(page + 1) })}>
              Next
            </button>
          </div>
        </div>
        {openId && <FindPanel id={openId} onClose={() => setOpenId(null)} />}
      </div>
    </div>
  );
}
