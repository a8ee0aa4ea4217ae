import { IntentLink } from "@/components/intent-link";
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
        <IntentLink href="/" className="no-underline" aria-label="Lodebook home">
          <Wordmark compact />
        </IntentLink>
        <nav aria-label="Main" className="order-last hidden w-full flex-wrap items-center gap-1 md:order-none md:flex md:w-auto">
          {actor && (
            <IntentLink href="/" className={linkClass}>
              Today
            </IntentLink>
          )}
          {actor ? (
            <>
              <IntentLink href="/finds" className={linkClass}>
                Finds
              </IntentLink>
              <IntentLink href="/outings" className={linkClass}>
                Outings
              </IntentLink>
              <IntentLink href="/map" className={linkClass}>
                Map
              </IntentLink>
              <IntentLink href="/sync" className={linkClass}>
                Camp sync
              </IntentLink>
              <IntentLink href="/weigh" className={linkClass}>
                Weigh
              </IntentLink>
              <IntentLink href="/scales" className={linkClass}>
                Scales
              </IntentLink>
              <IntentLink href="/barren-rock" className={linkClass}>
                Barren rock
              </IntentLink>
              <IntentLink href="/settings" className={linkClass}>
                Settings
              </IntentLink>
            </>
          ) : (
            <IntentLink href="/weigh" className={linkClass}>
              Weigh a specimen
            </IntentLink>
          )}
          {can(actor?.role, "viewLedger") && (
            <IntentLink href="/club" className={linkClass}>
              Club console
            </IntentLink>
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
            <IntentLink href="/sign-in" className="btn btn-primary">
              Sign in
            </IntentLink>
          )}
        </div>
      </div>
    </header>
  );
}
