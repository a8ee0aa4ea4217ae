import { LEDGER_CSV_COLUMNS, ledgerQuerySchema } from "@/lib/club/ledger";
import { toSafeCsv } from "@/lib/text/safe-text";
import { requireActor } from "@/server/auth/actor";
import { ledgerRows } from "@/server/club/ledger";
import { parseSearchParams, route } from "@/server/http";

/** The filtered ledger as CSV, every row, not just one page; safe to open in a spreadsheet. */
export const GET = route(async (req) => {
  const query = parseSearchParams(req, ledgerQuerySchema, "ledger");
  await requireActor(req, "viewLedger", "club");
  const rows = ledgerRows(query).map((r) => ({ ...r, foundAt: new Date(r.foundAt).toISOString() }));
  const csv = toSafeCsv(LEDGER_CSV_COLUMNS, rows.map((r) => LEDGER_CSV_COLUMNS.map((c) => r[c])));
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="lodebook-ledger-${new Date().toISOString().slice(0, 10)}.csv"`,
      "Cache-Control": "no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
