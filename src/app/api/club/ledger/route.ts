import { ledgerQuerySchema } from "@/lib/club/ledger";
import { requireActor } from "@/server/auth/actor";
import { ledgerPage } from "@/server/club/ledger";
import { json, parseSearchParams, route } from "@/server/http";

/** The club ledger: one page of the filtered finds, with totals over all of them. */
export const GET = route(async (req) => {
  await requireActor(req, "viewLedger", "club");
  const query = parseSearchParams(req, ledgerQuerySchema, "ledger");
  return json(ledgerPage(query));
});
