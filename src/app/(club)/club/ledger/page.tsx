import type { Metadata } from "next";
import { Suspense } from "react";
import { LedgerScreen } from "@/components/club/ledger-screen";
import { ledgerQuerySchema } from "@/lib/club/ledger";
import { requirePageActor } from "@/server/auth/current";
import { listClaims } from "@/server/club/claims";
import { ledgerPage, ledgerSeasons } from "@/server/club/ledger";
import { listMembers } from "@/server/queries/members";

export const metadata: Metadata = { title: "Club ledger" };

type Search = Record<string, string | string[] | undefined>;

/** The address's query string as the browser's URLSearchParams writes it (the client's cache key). */
function queryString(search: Search): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(search)) for (const one of Array.isArray(v) ? v : v === undefined ? [] : [v]) params.append(k, one);
  return params.toString();
}

export default async function LedgerPage({ searchParams }: { searchParams: Promise<Search> }) {
  await requirePageActor("viewLedger", "/club/ledger");
  // The first page is rendered here, so the ledger does not jump when it arrives; filters the
  // server refuses are left to the client, which shows the message naming the field.
  const query = queryString(await searchParams);
  const parsed = ledgerQuerySchema.safeParse(Object.fromEntries(new URLSearchParams(query)));
  const first = parsed.success ? { query, page: ledgerPage(parsed.data) } : undefined;
  const claims = listClaims().map((c) => ({ id: c.id, name: c.name }));
  const members = listMembers().map((m) => ({ id: m.id, name: m.name ?? m.email }));
  return (
    <Suspense>
      <LedgerScreen claims={claims} members={members} seasons={ledgerSeasons()} first={first} />
    </Suspense>
  );
}
