"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

const SCREENS = [
  ["/club", "Season at a glance"],
  ["/club/ledger", "Club ledger"],
  ["/club/claims", "Claims"],
  ["/club/members", "Members"],
  ["/club/prices", "Club and price"],
] as const;

/**
 * The console's screens in one row above the work (a laptop's width goes to the ledger, not
 * to a sidebar); the screen in use is marked.
 */
export function ConsoleNav({ caughtMail }: { caughtMail: boolean }) {
  const pathname = usePathname();
  const current = (href: string) => (href === "/club" ? pathname === "/club" : pathname.startsWith(href));
  const link = "rounded-md px-3 py-2 font-bold underline-offset-4 hover:underline aria-[current=page]:bg-ochre aria-[current=page]:text-ochre-ink";
  return (
    <nav aria-label="Club console" className="no-print flex flex-wrap items-center gap-1 border-b border-rule pb-2">
      {SCREENS.map(([href, label]) => (
        <Link key={href} href={href} className={link} aria-current={current(href) ? "page" : undefined}>
          {label}
        </Link>
      ))}
      <a href="/api/club/backup" className={link} download>
        Download a backup
      </a>
      {caughtMail && (
        <Link href="/club/mail" className={link} aria-current={current("/club/mail") ? "page" : undefined}>
          Caught mail (demo)
        </Link>
      )}
    </nav>
  );
}
