import { ConsoleNav } from "@/components/club/console-nav";
import { QueryProvider } from "@/components/club/query-provider";
import { SiteHeader } from "@/components/site-header";
import { requirePageActor } from "@/server/auth/current";
import { caughtMailDir } from "@/server/mail/caught";

export default async function ClubLayout({ children }: { children: React.ReactNode }) {
  const actor = await requirePageActor("viewLedger", "/club");
  return (
    <>
      <SiteHeader actor={actor} />
      <div className="mx-auto flex max-w-[96rem] flex-col gap-4 px-4 py-4">
        <ConsoleNav caughtMail={Boolean(caughtMailDir())} />
        <main className="min-w-0">
          <QueryProvider>{children}</QueryProvider>
        </main>
      </div>
    </>
  );
}
