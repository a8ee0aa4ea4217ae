import Link from "next/link";
import { Wordmark } from "@/components/wordmark";

// next/link, not IntentLink: this boundary is in every page's tree, and a client component it
// names is loaded with the chunks of whichever page Next first found it in (a member screen's
// first load grew by the finds list's chunk through it).
export default function NotFound() {
  return (
    <main className="mx-auto flex max-w-md flex-col gap-4 px-4 py-8">
      <Wordmark />
      <section className="sheet flex flex-col gap-2">
        <h1 className="text-2xl font-bold">Nothing here</h1>
        <p>This page does not exist, or you may not see it.</p>
        <Link href="/" className="btn btn-primary">
          Back to today
        </Link>
      </section>
    </main>
  );
}
