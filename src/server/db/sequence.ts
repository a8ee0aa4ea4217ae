import "server-only";
import { statement, type Sqlite } from "./rows";

/** The next value of the server's change sequence: what pull cursors compare, never a clock. */
export function nextSeq(sqlite: Sqlite): number {
  const row = statement(
    sqlite,
    "insert into sequences (name, value) values ('change', 1) on conflict(name) do update set value = value + 1 returning value",
  ).get() as { value: number };
  return row.value;
}

/**
 * Sequence numbers for one batch: the counter is read once, handed out in memory and stored
 * once at the end. Only inside an immediate transaction, where no other writer can
 * interleave; a number left unused by a rolled-back savepoint is a harmless gap.
 */
export function sequenceBlock(sqlite: Sqlite): { next: () => number; reserve: (n: number) => number; store: () => void } {
  const row = statement(sqlite, "select value from sequences where name = 'change'").get() as { value: number } | undefined;
  const start = row?.value ?? 0;
  let value = start;
  return {
    next: () => ++value,
    /** n consecutive numbers; returns the first. */
    reserve: (n: number) => {
      const first = value + 1;
      value += n;
      return first;
    },
    store: () => {
      if (value === start) return;
      statement(sqlite, "insert into sequences (name, value) values ('change', ?) on conflict(name) do update set value = excluded.value").run(value);
    },
  };
}
