import { IntentLink } from "@/components/intent-link";
import { ThemeToggle } from "@/components/theme-toggle";
import { Wordmark } from "@/components/wordmark";

/** Pages anyone may use, signed in or not; static, so they open offline too. */
export default function OpenLayout({ children }: { children: React.ReactNode }) {
  return (
    <>
      <header className="no-print border-b-2 border-rule bg-sheet">
        <div className="mx-auto flex max-w-6xl items-center justify-between gap-2 px-3 py-2">
          <IntentLink href="/" className="no-underline" aria-label="Lodebook home">
            <Wordmark compact />
          </IntentLink>
          <div className="flex items-center gap-2">
            <ThemeToggle />
            <IntentLink href="/" className="btn">
              My logbook
            </IntentLink>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-5xl px-3 py-4">{children}</main>
    </>
  );
}
