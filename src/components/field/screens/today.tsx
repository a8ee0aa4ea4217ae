"use client";
import { lazy, Suspense } from "react";
import { useQueryOnceCopied } from "@/client/first-copy";
import { IntentLink } from "@/components/intent-link";
import type { LodebookDb } from "@/client/device-db";
import { readClaims, readCurrentOuting } from "@/client/hooks";
import { endOuting, startOuting, stripLocal } from "@/client/logbook";
import { useMember } from "@/client/member";
import { DEFAULT_SETTINGS, readSettings } from "@/client/settings";
import { requestSync } from "@/client/sync/scheduler";
import { SyncStatusView } from "@/components/sync/sync-status";
import { KIND_LABELS } from "@/lib/entities/constants";
import { METHOD_LABELS, OUTING_METHODS } from "@/lib/entities/constants";
import { formatDay, formatGrams, formatWhen } from "@/lib/format";
import { can } from "@/lib/roles";
import { deviceSeasonBounds } from "@/lib/time/device-season";
import { deviceTotals } from "@/lib/club/totals";
import { Skeleton } from "../skeleton";
import { ClaimOptions, MethodOptions } from "../options";

// Queried finds are rare: their list and the query logic come in a chunk of their own.
const QueriedFinds = lazy(() => import("../queried-finds").then((m) => ({ default: m.QueriedFinds })));

/**
 * Everything Today shows, read in one transaction: a camp sync that writes finds, outings and
 * claims re-reads it once and draws Today once, where a query per table re-read and redrew it
 * once per table, on the main thread a phone's first screen needs.
 */
function readToday(db: LodebookDb, start: number, end: number) {
  return db.transaction("r", [db.settings, db.outings, db.claims, db.finds, db.reviews], async () => {
    const [settings, outing, claims, finds, reviews] = await Promise.all([
      readSettings(db),
      readCurrentOuting(db),
      readClaims(db),
      db.finds.where("foundAt").between(start, end).reverse().sortBy("foundAt"),
      db.reviews.count(),
    ]);
    return { settings, outing, claims, finds, reviewed: reviews > 0 };
  });
}

/** Today; `caution` (the field caution, drawn on the server) closes it. */
export function TodayScreen({ caution }: { caution: React.ReactNode }) {
  const { member, db } = useMember();
  // The member's own days, as their phone's clock shows them.
  const { season, start, end } = deviceSeasonBounds();
  const today = useQueryOnceCopied(db, () => readToday(db, start, end), [start, end]);
  const settings = today?.settings ?? DEFAULT_SETTINGS;
  const outing = today?.outing;
  const claims = today?.claims;
  const finds = today?.finds;
  const first = (member.name ?? member.email).split(" ")[0];
  const tally = deviceTotals(finds ?? []);
  const claimName = (id: string | null) => claims?.find((c) => c.id === id)?.name ?? "no claim";

  return (
    <>
      <h1 className="text-2xl font-bold">Good day, {first}</h1>

      <IntentLink href="/finds/new" className="btn btn-primary min-h-[64px] text-xl" data-testid="log-find">
        Log a find
      </IntentLink>

      {/* No review on the device, no query: neither the chunk nor its read is needed. */}
      {today?.reviewed && (
        <Suspense fallback={null}>
          <QueriedFinds db={db} />
        </Suspense>
      )}

      <section className="sheet flex flex-col gap-3" aria-labelledby="outing-title">
        <h2 id="outing-title" className="heading-bar self-start text-lg">
          Today&apos;s outing
        </h2>
        {outing === undefined ? (
          // Two rows, the height of the start form (two fields over a button) within a few
          // pixels: one row grew by 65 px when the form came, moving every section below it.
          <Skeleton lines={2} />
        ) : outing ? (
          <>
            <p>
              <strong>{METHOD_LABELS[outing.method]}</strong> on <strong>{claimName(outing.claimId)}</strong> since {formatWhen(outing.startedAt)}
            </p>
            <div className="flex flex-wrap gap-2">
              <IntentLink className="btn" href={`/outings/view#id=${outing.id}`}>
                Notes and details
              </IntentLink>
              <button
                type="button"
                className="btn"
                onClick={async () => {
                  await endOuting(db, stripLocal(outing));
                  requestSync();
                }}
              >
                End the outing
              </button>
            </div>
          </>
        ) : (
          <form
            key={claims?.length ?? 0}
            className="flex flex-col gap-3"
            onSubmit={async (e) => {
              e.preventDefault();
              const data = new FormData(e.currentTarget);
              await startOuting(db, { claimId: (data.get("claimId") as string) || null, method: data.get("method") as (typeof OUTING_METHODS)[number] });
              requestSync();
            }}
          >
            <div className="grid grid-cols-2 gap-2">
              <label className="flex flex-col">
                <span className="field-label">Claim</span>
                <select name="claimId" className="field-input">
                  <ClaimOptions claims={(claims ?? []).filter((c) => c.active)} />
                  <option value="">Off the club&apos;s claims</option>
                </select>
              </label>
              <label className="flex flex-col">
                <span className="field-label">Method</span>
                <select name="method" className="field-input" defaultValue="detecting">
                  <MethodOptions />
                </select>
              </label>
            </div>
            <button type="submit" className="btn">
              Start an outing
            </button>
          </form>
        )}
      </section>

      <SyncStatusView db={db} compact />

      <section className="sheet" aria-labelledby="season-title">
        <h2 id="season-title" className="heading-bar mb-3 text-lg">
          Your {season} season
        </h2>
        <dl className="grid grid-cols-3 gap-3 text-center">
          <div>
            <dt className="text-sm text-ink-soft">Finds</dt>
            <dd className="figure text-2xl font-bold" data-testid="tally-finds">
              {finds?.length ?? "…"}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Fine gold (est.)</dt>
            <dd className="figure text-2xl font-bold" data-testid="tally-fine">
              {formatGrams(tally.fineGrams, settings.massUnit)}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Recorded weight</dt>
            <dd className="figure text-2xl font-bold">{formatGrams(tally.weightGrams, settings.massUnit)}</dd>
          </div>
        </dl>
        {tally.finds > tally.figured && (
          <p className="mt-2 text-sm text-ink-soft">
            {tally.finds - tally.figured} {tally.finds - tally.figured === 1 ? "find has" : "finds have"} no fine-gold figure yet: specimens not weighed, or
            finds the club&apos;s server has not figured since your last camp sync.
          </p>
        )}
      </section>

      <section aria-labelledby="recent-title" className="flex flex-col gap-2">
        <h2 id="recent-title" className="heading-bar self-start text-lg">
          Recent finds
        </h2>
        {finds === undefined ? (
          <Skeleton lines={2} />
        ) : finds.length === 0 ? (
          <p className="text-ink-soft">No finds this season yet. Your first one will show here.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {finds.slice(0, 5).map((f) => (
              <li key={f.id}>
                <IntentLink href={`/finds/view#id=${f.id}`} className="sheet flex items-baseline justify-between gap-2 no-underline">
                  <span>
                    <span className="font-bold">{KIND_LABELS[f.kind]}</span>
                    <span className="text-ink-soft">
                      {" "}
                      · {claimName(f.claimId)} · {formatDay(f.foundAt)}
                    </span>
                  </span>
                  <span className="figure font-bold">{f.weightGrams != null ? formatGrams(f.weightGrams, settings.massUnit) : "—"}</span>
                </IntentLink>
              </li>
            ))}
          </ul>
        )}
      </section>

      {can(member.role, "viewLedger") && (
        <IntentLink href="/club" className="btn">
          Open the club console
        </IntentLink>
      )}
      {caution}
    </>
  );
}
