import type { Metadata } from "next";
import Link from "next/link";
import { Caution } from "@/components/caution";
import { formatDay, formatGrams } from "@/components/figures";
import { can } from "@/lib/roles";
import { currentSeason } from "@/lib/season";
import { requirePageActor } from "@/server/auth/current";
import { memberSeasonTally, recentFindsOf } from "@/server/queries/tally";

export const metadata: Metadata = { title: "Today" };

export default async function TodayPage() {
  const actor = await requirePageActor(undefined, "/");
  const season = currentSeason();
  const tally = memberSeasonTally(actor.id, season);
  const recent = recentFindsOf(actor.id);
  const firstName = (actor.name ?? actor.email).split(" ")[0];

  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-2xl font-bold">Good day, {firstName}</h1>

      {can(actor.role, "viewLedger") && (
        <section className="sheet flex flex-wrap items-center justify-between gap-3" aria-label="Club console">
          <p className="font-bold">You keep the club&apos;s books.</p>
          <Link href="/club" className="btn btn-primary">
            Open the club console
          </Link>
        </section>
      )}

      <section className="sheet" aria-labelledby="season-title">
        <h2 id="season-title" className="heading-bar mb-3 text-lg">
          Your {season} season
        </h2>
        <dl className="grid grid-cols-3 gap-3 text-center">
          <div>
            <dt className="text-sm text-ink-soft">Finds</dt>
            <dd className="figure text-2xl font-bold" data-testid="tally-finds">{tally.finds}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Recorded weight</dt>
            <dd className="figure text-2xl font-bold">{formatGrams(tally.weightGrams)}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Fine gold (est.)</dt>
            <dd className="figure text-2xl font-bold">{formatGrams(tally.fineGoldGrams)}</dd>
          </div>
        </dl>
      </section>

      <section className="flex flex-col gap-2" aria-labelledby="quick-title">
        <h2 id="quick-title" className="heading-bar text-lg">
          Quick
        </h2>
        <div className="grid grid-cols-1 gap-2 sm:grid-cols-2">
          <Link href="/weigh" className="btn btn-primary">
            Weigh a specimen
          </Link>
        </div>
      </section>

      <section aria-labelledby="recent-title" className="flex flex-col gap-2">
        <h2 id="recent-title" className="heading-bar text-lg">
          Recent finds
        </h2>
        {recent.length === 0 ? (
          <p className="text-ink-soft">No finds yet. Your first one will show here.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {recent.map((f) => (
              <li key={f.id} className="sheet flex items-baseline justify-between gap-2">
                <span>
                  <span className="font-bold capitalize">{f.kind}</span>
                  <span className="text-ink-soft"> · {f.claimName ?? "off-claim"} · {formatDay(f.foundAt)}</span>
                </span>
                <span className="figure font-bold">
                  {f.weightGrams != null ? formatGrams(f.weightGrams) : "—"}
                  {f.fineGoldGrams != null && <span className="block text-sm text-ink-soft">≈ {formatGrams(f.fineGoldGrams)} fine</span>}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>

      <Caution title="Before you head out">
        Tell someone where you are going and when you will be back. Stay out of old mine workings, watch dry washes for flash
        floods, and carry water. Claim rules differ by place and land agency: your club officer and the local authority have the
        last word.
      </Caution>
    </div>
  );
}
