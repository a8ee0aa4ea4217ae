import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { FIND_KEYS } from "@/lib/entities/keys";
import { FIND_FIELD_LABELS, type ThreadEvent } from "@/lib/club/thread";
import { clubDay } from "@/lib/time/club-day";
import { KIND_LABELS } from "@/lib/entities/constants";
import { getDb } from "../db";
import * as t from "../db/schema";
import { logger } from "../log";
import { sendMailLater } from "../mail";
import { queryMessage } from "../mail/messages";
import { siteLink } from "../site-link";
import { clubSettings } from "./settings";

/**
 * "Changed since the query", for a listed ledger row: the find is queried or answered and the
 * member changed it, or added, changed or removed a weigh-in of it, after the latest query.
 * Derived, not kept: it is read for the rows of a page (the reviews_find and weigh_ins_find
 * indexes), and filtered on only behind `review_state in ('queried', 'answered')`, so the
 * ledger's covering index serves every other filter untouched.
 */
export const CHANGED_SINCE_QUERY = `case when f.review_state in ('queried', 'answered') then coalesce((
    select max(f.updated_at, coalesce((select max(coalesce(w.deleted_at, w.updated_at)) from weigh_ins w where w.find_id = f.id), 0)) > r.created_at
    from reviews r where r.find_id = f.id and r.action = 'query' order by r.created_at desc, r.seq desc limit 1), 0) else 0 end`;

/**
 * The find's query thread in the order things reached the server: every review, the member's
 * answers, and from the first review on, the member's changes to the find (which fields, from
 * the versions kept in record_history) and weigh-ins added or removed.
 */
export function threadOf(findId: string): ThreadEvent[] {
  const db = getDb();
  const reviews = db
    .select({ id: t.reviews.id, at: t.reviews.createdAt, seq: t.reviews.seq, action: t.reviews.action, note: t.reviews.note, by: t.members.name })
    .from(t.reviews)
    .leftJoin(t.members, eq(t.members.id, t.reviews.officerId))
    .where(eq(t.reviews.findId, findId))
    .orderBy(asc(t.reviews.createdAt), asc(t.reviews.seq))
    .all();
  if (reviews.length === 0) return [];
  const since = reviews[0].at;
  const answers = db
    .select({ id: t.answers.id, at: t.answers.createdAt, note: t.answers.note, by: t.members.name })
    .from(t.answers)
    .leftJoin(t.members, eq(t.members.id, t.answers.memberId))
    .where(eq(t.answers.findId, findId))
    .all();
  const events: ThreadEvent[] = [
    ...reviews.map((r) => ({ kind: "review" as const, id: r.id, at: r.at, action: r.action, note: r.note, by: r.by })),
    ...answers.map((a) => ({ kind: "answer" as const, ...a })),
    ...editsOf(findId, since),
    ...db
      .select({ id: t.weighIns.id, createdAt: t.weighIns.createdAt, deletedAt: t.weighIns.deletedAt })
      .from(t.weighIns)
      .where(eq(t.weighIns.findId, findId))
      .all()
      .flatMap((w) => [
        ...(w.createdAt > since ? [{ kind: "weighIn" as const, id: w.id, at: w.createdAt, removed: false }] : []),
        ...(w.deletedAt !== null && w.deletedAt > since ? [{ kind: "weighIn" as const, id: `${w.id}:removed`, at: w.deletedAt, removed: true }] : []),
      ]),
  ];
  // Same millisecond: the officer's step first, then what answers it.
  const order = { review: 0, edit: 1, weighIn: 2, answer: 3 };
  return events.sort((a, b) => a.at - b.at || order[a.kind] - order[b.kind]);
}

/**
 * The member's changes to the find after `since`: each row of record_history is the version an
 * arriving change replaced (at `replacedAt`); what changed is that version against the next.
 */
function editsOf(findId: string, since: number): ThreadEvent[] {
  const db = getDb();
  const history = db
    .select({ id: t.recordHistory.id, at: t.recordHistory.replacedAt, version: t.recordHistory.version })
    .from(t.recordHistory)
    .where(and(eq(t.recordHistory.entity, "find"), eq(t.recordHistory.entityId, findId)))
    .orderBy(asc(t.recordHistory.id))
    .all()
    .filter((h) => h.version && !(h.version as { lateEditAfterDelete?: boolean }).lateEditAfterDelete);
  const current = db.select().from(t.finds).where(eq(t.finds.id, findId)).get() as Record<string, unknown> | undefined;
  if (!current) return [];
  const versions = [...history.map((h) => h.version), current];
  const events: ThreadEvent[] = [];
  history.forEach((h, i) => {
    if (h.at <= since) return;
    const fields = [...new Set(FIND_KEYS.filter((k) => !same(versions[i][k], versions[i + 1][k])).map((k) => FIND_FIELD_LABELS[k] ?? k))];
    if (fields.length > 0) events.push({ kind: "edit", id: `edit:${h.id}`, at: h.at, fields });
  });
  return events;
}

const same = (a: unknown, b: unknown) => (a ?? null) === (b ?? null);

/**
 * Tells the member by e-mail that a find of theirs was queried, when they asked for it.
 * Sent after the answer to the officer; without a configured origin (no link to give) it is
 * logged and left out, and the query stands.
 */
export function mailQueryIfAsked(findId: string, officerName: string | null, note: string): void {
  const db = getDb();
  const row = db
    .select({ email: t.members.email, wants: t.members.mailOnQuery, active: t.members.active, kind: t.finds.kind, foundAt: t.finds.foundAt })
    .from(t.finds)
    .innerJoin(t.members, eq(t.members.id, t.finds.memberId))
    .where(eq(t.finds.id, findId))
    .get();
  if (!row || !row.wants || !row.active) return;
  let link: string;
  try {
    link = siteLink(`/finds/view#id=${findId}`);
  } catch (error) {
    logger.warn({ code: "mail_skipped", what: "query mail", reason: (error as Error).message }, "query mail not sent");
    return;
  }
  const club = clubSettings();
  const message = queryMessage({
    link,
    club: club.name,
    officer: officerName,
    note,
    find: `${KIND_LABELS[row.kind].toLowerCase()} found ${clubDay(row.foundAt, club.timeZone)}`,
  });
  sendMailLater({ to: row.email, ...message }, "query mail");
}
