import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { formatGrams } from "@/lib/format";
import { withoutBidiControls } from "@/lib/text/safe-text";
import type { Totals } from "@/lib/club/totals";
import { getDb } from "../db";
import { members } from "../db/schema";
import { sendMail } from "../mail";
import { totalsBy } from "./totals";

const DAY = 86_400_000;

type DigestQuery = { memberName: string | null; kind: string; foundAt: number; note: string };
export type Digest = {
  since: number;
  newFinds: { claimName: string | null; totals: Totals }[];
  /** Queries the member has not answered yet. */
  openQueries: DigestQuery[];
  /** Queries the member has answered: for an officer to look at again (verify or query again). */
  answeredQueries: (DigestQuery & { answer: string })[];
};

/** What officers should know about the past week: new finds by claim, queries still open, and queries answered. */
export function buildDigest(now = Date.now(), days = 7): Digest {
  const db = getDb();
  const since = now - days * DAY;
  const newFinds = totalsBy<{ k0: string | null; k1: string | null }>(
    sql`from finds f left join claims c on c.id = f.claim_id where f.deleted_at is null and f.created_at >= ${since}`,
    [sql`f.claim_id`, sql`c.name`],
  )
    .map((r) => ({ claimName: r.k1, totals: r.totals }))
    .sort((a, b) => (a.claimName ?? "\uffff").localeCompare(b.claimName ?? "\uffff"));
  // Each find whose latest verify or query is a query, with the member's latest answer to it.
  const queries = db.all<DigestQuery & { answer: string | null }>(sql`
    select m.name as memberName, f.kind, f.found_at as foundAt, r.note,
      (select a.note from answers a where a.review_id = r.id and a.deleted_at is null order by a.created_at desc, a.seq desc limit 1) as answer
    from reviews r join finds f on f.id = r.find_id join members m on m.id = f.member_id
    where f.deleted_at is null and r.action = 'query'
      and r.id = (select r2.id from reviews r2 where r2.find_id = f.id and r2.action in ('verify','query') order by r2.created_at desc, r2.seq desc limit 1)
    order by r.created_at`);
  const openQueries = queries.filter((q) => q.answer === null).map(({ answer: _a, ...q }) => q);
  const answeredQueries = queries.filter((q): q is DigestQuery & { answer: string } => q.answer !== null);
  return { since, newFinds, openQueries, answeredQueries };
}

/**
 * Text people chose, on one line of the digest: without bidirectional controls, and with line
 * breaks (and other control characters) turned into spaces, so a name or a note cannot add
 * lines of its own that read as the digest's ("New finds by claim: …", a link to follow).
 */
function plain(text: string): string {
  return withoutBidiControls(text)
    .replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]+/g, " ")
    .trim();
}

function queryLine(q: DigestQuery): string {
  return `${q.memberName ? plain(q.memberName) : "?"} — ${q.kind} of ${new Date(q.foundAt).toISOString().slice(0, 10)}: ${plain(q.note)}`;
}

export function digestText(d: Digest): string {
  const lines = [`Lodebook — the club's week since ${new Date(d.since).toISOString().slice(0, 10)}`, "", "New finds by claim:"];
  if (d.newFinds.length === 0) lines.push("  none");
  for (const f of d.newFinds) {
    const t = f.totals;
    lines.push(
      `  ${f.claimName ? plain(f.claimName) : "off-claim"}: ${t.finds} find${t.finds === 1 ? "" : "s"}, ${formatGrams(t.fineGrams)} fine gold estimated (at worst ${formatGrams(t.fineLow)} to ${formatGrams(t.fineHigh)}), ${formatGrams(t.weightGrams)} recorded`,
    );
  }
  lines.push("", "Queries still open:");
  if (d.openQueries.length === 0) lines.push("  none");
  for (const q of d.openQueries) lines.push(`  ${queryLine(q)}`);
  lines.push("", "Queries answered, to look at again:");
  if (d.answeredQueries.length === 0) lines.push("  none");
  for (const q of d.answeredQueries) lines.push(`  ${queryLine(q)}`, `    answer: ${plain(q.answer)}`);
  lines.push("", "Figures are estimates, not assays.");
  return lines.join("\n");
}

/** Sends the digest to every active officer; returns how many were sent. */
export async function sendDigest(now = Date.now()): Promise<number> {
  const officers = getDb()
    .select({ email: members.email })
    .from(members)
    .where(and(eq(members.role, "officer"), eq(members.active, true)))
    .all();
  const text = digestText(buildDigest(now));
  for (const o of officers) await sendMail({ to: o.email, subject: "Lodebook: the club's week", text });
  return officers.length;
}
