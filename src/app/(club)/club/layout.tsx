import Link from "next/link";
import { SiteHeader } from "@/components/site-header";
import { requirePageActor } from "@/server/auth/current";
import { caughtMailDir } from "@/server/mail/caught";

export default async function ClubLayout({ children }: { children: React.ReactNode }) {
  const actor = await requirePageActor("viewLedger", "/club");
  return (
    <>
      <SiteHeader actor={actor} />
      <div className="mx-auto flex max-w-6xl flex-col gap-4 px-4 py-4 lg:flex-row">
        <nav aria-label="Club console" className="no-print flex gap-1 lg:w-48 lg:flex-col">
          <Link href="/club" className="btn justify-start">
            Season at a glance
          </Link>
          {caughtMailDir() && (
            <Link href="/club/mail" className="btn justify-start">
              Caught mail (demo)
            </Link>
          )}
        </nav>
        <main className="min-w-0 flex-1">{children}</main>
      </div>
    </>
  );
}
