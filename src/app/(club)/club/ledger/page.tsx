import type { Metadata } from "next";
import { Suspense } from "react";
import { LedgerScreen } from "@/components/club/ledger-screen";
import { requirePageActor } from "@/server/auth/current";
import { listClaims } from "@/server/club/claims";
import { ledgerSeasons } from "@/server/club/ledger";
import { listMembers } from "@/server/queries/members";

export const metadata: Metadata = { title: "Club ledger" };

export default async function LedgerPage() {
  await requirePageActor("viewLedger", "/club/ledger");
  const claims = listClaims().map((c) => ({ id: c.id, name: c.name }));
  const members = listMembers().map((m) => ({ id: m.id, name: m.name ?? m.email }));
  return (
    <Suspense>
      <LedgerScreen claims={claims} members={members} seasons={ledgerSeasons()} />
    </Suspense>
  );
}
