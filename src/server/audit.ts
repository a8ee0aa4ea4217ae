import "server-only";
import type { Db } from "./db";
import { auditLog } from "./db/schema";

type Tx = Pick<Db, "insert">;

/** Who did what to which record, with the record before and after (officers' changes). */
export function audit(tx: Tx, entry: { actorId: string; action: string; entity: string; entityId: string | null; before?: unknown; after?: unknown }) {
  tx.insert(auditLog)
    .values({ ...entry, before: entry.before ?? null, after: entry.after ?? null })
    .run();
}
