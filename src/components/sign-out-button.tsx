"use client";
import { useActionState } from "react";
import { signOutNow } from "@/server/actions/session";

export function SignOutButton() {
  const [, action, pending] = useActionState(signOutNow, {});
  return (
    // The device forgets who was signed in; that member's own database and outbox stay, to be
    // sent when they sign in again.
    <form action={action} onSubmit={() => localStorage.removeItem("lodebook-member")}>
      <button type="submit" className="btn" disabled={pending}>
        Sign out
      </button>
    </form>
  );
}
