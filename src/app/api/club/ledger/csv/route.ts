import { LEDGER_CSV_COLUMNS, ledgerQuerySchema } from "@/lib/club/ledger";
import { exportCells } from "@/lib/club/export-format";
import { toSafeCsv } from "@/lib/text/safe-text";
import { requireActor } from "@/server/auth/actor";
import { ledgerExportRows } from "@/server/club/ledger";
import { parseSearchParams, route } from "@/server/http";

/** The filtered ledger as CSV, every row with where and how it was found; safe to open in a spreadsheet. */
export const GET = route(async (req) => {
  await requireActor(req, "viewLedger", "club");
  const query = parseSearchParams(req, ledgerQuerySchema, "ledger");
  const csv = toSafeCsv(
    LEDGER_CSV_COLUMNS,
    ledgerExportRows(query).map((r) => exportCells(r, LEDGER_CSV_COLUMNS)),
  );
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="lodebook-ledger-${new Date().toISOString().slice(0, 10)}.csv"`,
      "Cache-Control": "no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
