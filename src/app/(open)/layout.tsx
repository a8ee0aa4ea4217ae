import Link from "next/link";
import { ThemeToggle } from "@/components/theme-toggle";
import { Wordmark } from "@/components/wordmark";

/** Pages anyone may use, signed in or not; static, so they open offline too. */
export default function OpenLayout({ children }: { children: React.ReactNode }) {
  return (
    <>
      <header className="no-print border-b-2 border-rule bg-sheet">
        <div className="mx-auto flex max-w-6xl items-center justify-between gap-2 px-3 py-2">
          <Link href="/" className="no-underline" aria-label="Lodebook home">
            <Wordmark compact />
          </Link>
          <div className="flex items-center gap-2">
            <ThemeToggle />
            <Link href="/" className="btn">
              My logbook
            </Link>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-5xl px-3 py-4">{children}</main>
    </>
  );
}
