import Database from "better-sqlite3";
import { DEMO } from "./pages";

/** One of the member's own finds that has a weigh-in, one with an officer's review, and one of their outings. */
export function memberRecords(databaseUrl: string) {
  const db = new Database(databaseUrl, { readonly: true });
  try {
    const find = db
      .prepare(
        "select f.id from finds f join members m on m.id = f.member_id where m.email = ? and f.deleted_at is null and exists (select 1 from weigh_ins w where w.find_id = f.id) limit 1",
      )
      .get(DEMO.member.email) as { id: string };
    const outing = db.prepare("select o.id from outings o join members m on m.id = o.member_id where m.email = ? limit 1").get(DEMO.member.email) as {
      id: string;
    };
    // A find the officers have reviewed (the demo club queries and verifies some): its thread
    // opens above the rest of the find.
    const reviewed = db
      .prepare(
        "select f.id from finds f join members m on m.id = f.member_id where m.email = ? and f.deleted_at is null and exists (select 1 from reviews r where r.find_id = f.id) limit 1",
      )
      .get(DEMO.member.email) as { id: string };
    return { find: find.id, outing: outing.id, reviewed: reviewed.id };
  } finally {
    db.close();
  }
}

/**
 * Every member screen, records included. The reviewed find comes after another screen, so that
 * it opens in a page of its own rather than as a move within the first find's page.
 */
export function memberScreens({ find, outing, reviewed }: ReturnType<typeof memberRecords>) {
  return [
    "/",
    "/finds",
    "/finds/new",
    `/finds/view#id=${find}`,
    "/outings",
    `/finds/view#id=${reviewed}`,
    `/outings/view#id=${outing}`,
    "/map",
    "/sync",
    "/settings",
    "/scales",
    "/barren-rock",
    "/weigh",
  ];
}
