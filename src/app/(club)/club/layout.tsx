import Link from "next/link";
import { QueryProvider } from "@/components/club/query-provider";
import { SiteHeader } from "@/components/site-header";
import { requirePageActor } from "@/server/auth/current";
import { caughtMailDir } from "@/server/mail/caught";

export default async function ClubLayout({ children }: { children: React.ReactNode }) {
  const actor = await requirePageActor("viewLedger", "/club");
  return (
    <>
      <SiteHeader actor={actor} />
      <div className="mx-auto flex max-w-6xl flex-col gap-4 px-4 py-4 lg:flex-row">
        <nav aria-label="Club console" className="no-print flex flex-wrap gap-1 lg:w-52 lg:flex-col">
          {[
            ["/club", "Season at a glance"],
            ["/club/ledger", "Club ledger"],
            ["/club/claims", "Claims"],
            ["/club/members", "Members"],
            ["/club/prices", "Club and price"],
          ].map(([href, label]) => (
            <Link key={href} href={href} className="btn justify-start">
              {label}
            </Link>
          ))}
          <a href="/api/club/backup" className="btn justify-start" download>
            Download a backup
          </a>
          {caughtMailDir() && (
            <Link href="/club/mail" className="btn justify-start">
              Caught mail (demo)
            </Link>
          )}
        </nav>
        <main className="min-w-0 flex-1">
          <QueryProvider>{children}</QueryProvider>
        </main>
      </div>
    </>
  );
}
