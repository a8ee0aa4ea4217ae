import type { Metadata } from "next";
import { Wordmark } from "@/components/wordmark";

export const metadata: Metadata = { title: "Offline" };

/** Shown by the service worker when a page was never opened while online. */
export default function OfflinePage() {
  return (
    <main className="mx-auto flex max-w-md flex-col gap-4 px-4 py-8">
      <Wordmark />
      <section className="sheet flex flex-col gap-2">
        <h1 className="text-2xl font-bold">No signal</h1>
        <p>This page has not been opened on this device while online, so it is not stored here yet.</p>
        <p>Everything you have already saved is safe on the device and will go to the club at the next camp sync.</p>
        {/* A full navigation on purpose: the service worker answers it from its cache. */}
        {/* eslint-disable-next-line @next/next/no-html-link-for-pages */}
        <a href="/" className="btn btn-primary">
          Back to today
        </a>
      </section>
    </main>
  );
}
