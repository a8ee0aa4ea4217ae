import Link from "next/link";
import { can, ROLE_LABELS, type Role } from "@/lib/roles";
import { SignOutButton } from "./sign-out-button";
import { ThemeToggle } from "./theme-toggle";
import { Wordmark } from "./wordmark";

const linkClass = "inline-flex min-h-touch items-center rounded-md px-3 font-bold no-underline hover:underline";

/** Who is signed in, as much as the header needs: works for server pages and the offline shell. */
export type HeaderPerson = { name: string | null; email: string; role: Role };

export function SiteHeader({ actor }: { actor: HeaderPerson | null }) {
  return (
    <header className="no-print border-b-2 border-rule bg-sheet">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-x-2 gap-y-1 px-3 py-2">
        <Link href="/" className="no-underline" aria-label="Lodebook home">
          <Wordmark compact />
        </Link>
        <nav aria-label="Main" className="order-last hidden w-full flex-wrap items-center gap-1 md:order-none md:flex md:w-auto">
          {actor && (
            <Link href="/" className={linkClass}>
              Today
            </Link>
          )}
          {actor ? (
            <>
              <Link href="/finds" className={linkClass}>
                Finds
              </Link>
              <Link href="/outings" className={linkClass}>
                Outings
              </Link>
              <Link href="/map" className={linkClass}>
                Map
              </Link>
              <Link href="/sync" className={linkClass}>
                Camp sync
              </Link>
              <Link href="/weigh" className={linkClass}>
                Weigh
              </Link>
              <Link href="/scales" className={linkClass}>
                Scales
              </Link>
              <Link href="/barren-rock" className={linkClass}>
                Barren rock
              </Link>
              <Link href="/settings" className={linkClass}>
                Settings
              </Link>
            </>
          ) : (
            <Link href="/weigh" className={linkClass}>
              Weigh a specimen
            </Link>
          )}
          {can(actor?.role, "viewLedger") && (
            <Link href="/club" className={linkClass}>
              Club console
            </Link>
          )}
        </nav>
        <div className="flex items-center gap-2">
          {actor && (
            <span className="hidden text-sm text-ink-soft sm:inline" data-testid="who">
              {actor.name ?? actor.email} · {ROLE_LABELS[actor.role]}
            </span>
          )}
          <ThemeToggle />
          {actor ? (
            <SignOutButton />
          ) : (
            <Link href="/sign-in" className="btn btn-primary">
              Sign in
            </Link>
          )}
        </div>
      </div>
    </header>
  );
}
