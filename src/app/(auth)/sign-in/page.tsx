import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentActor } from "@/server/auth/current";
import { safeReturnPath } from "@/lib/web/return-path";
import { SignInForms } from "./sign-in-forms";

export const metadata: Metadata = { title: "Sign in" };

type Props = { searchParams: Promise<{ from?: string; signedOut?: string; error?: string; joined?: string }> };

export default async function SignInPage({ searchParams }: Props) {
  const params = await searchParams;
  const from = safeReturnPath(params.from);
  if (await currentActor()) redirect(from);
  return (
    <>
      <section aria-labelledby="sign-in-title" className="sheet flex flex-col gap-4">
        <h1 id="sign-in-title" className="text-2xl font-bold">
          Sign in to your club
        </h1>
        {params.signedOut && (
          <p role="status" className="font-bold text-moss">
            You are signed out.
          </p>
        )}
        {params.joined && (
          <p role="status" className="font-bold text-moss">
            Welcome to the club. Sign in with your e-mail and new password.
          </p>
        )}
        {params.error && (
          <p role="alert" className="font-bold text-rust">
            {params.error === "Verification"
              ? "That sign-in link has been used or has run out. Ask for a new one."
              : "Sign-in did not work. Try again, or ask your club officer."}
          </p>
        )}
        <SignInForms from={from} />
      </section>
      <p className="text-sm text-ink-soft">
        No account? Club officers send invitations. You can still{" "}
        <a href="/weigh" className="font-bold underline">
          estimate a specimen
        </a>{" "}
        without one.
      </p>
    </>
  );
}
