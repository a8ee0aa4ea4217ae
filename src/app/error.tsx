"use client";

/** Our own error page: says what happened in plain words, never a stack trace. */
export default function ErrorPage({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto flex max-w-md flex-col gap-4 px-4 py-8">
      <section className="sheet flex flex-col gap-2">
        <h1 className="text-2xl font-bold">Something went wrong</h1>
        <p>The page could not be shown. Nothing you saved on this device is lost.</p>
        <button type="button" className="btn btn-primary" onClick={reset}>
          Try again
        </button>
      </section>
    </main>
  );
}
