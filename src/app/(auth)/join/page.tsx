import type { Metadata } from "next";
import { JoinForm } from "./join-form";

export const metadata: Metadata = { title: "Join your club" };

export default function JoinPage() {
  return (
    <section className="sheet flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Join your club&apos;s Lodebook</h1>
      <p>Choose your name as the club will see it, and a password.</p>
      <JoinForm />
    </section>
  );
}
