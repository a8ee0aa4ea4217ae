import "server-only";
import { sql } from "drizzle-orm";
import type { Db } from ".";

type Tx = Pick<Db, "get">;

/** The next value of the server's change sequence: what pull cursors compare, never a clock. */
export function nextSeq(tx: Tx): number {
  const row = tx.get<{ value: number }>(
    sql`insert into sequences (name, value) values ('change', 1) on conflict(name) do update set value = value + 1 returning value`,
  );
  return row.value;
}
