import { IntentLink } from "@/components/intent-link";
import { Wordmark } from "@/components/wordmark";

export default function NotFound() {
  return (
    <main className="mx-auto flex max-w-md flex-col gap-4 px-4 py-8">
      <Wordmark />
      <section className="sheet flex flex-col gap-2">
        <h1 className="text-2xl font-bold">Nothing here</h1>
        <p>This page does not exist, or you may not see it.</p>
        <IntentLink href="/" className="btn btn-primary">
          Back to today
        </IntentLink>
      </section>
    </main>
  );
}
