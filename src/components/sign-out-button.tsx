"use client";
import { useActionState } from "react";
import { signOutNow } from "@/server/actions/session";

export function SignOutButton() {
  const [, action, pending] = useActionState(signOutNow, {});
  return (
    // The device forgets who was signed in; that member's own database and outbox stay, to be
    // sent when they sign in again. Signing out needs the club's server: with no signal, the
    // member is told so instead of meeting an error page.
    <form
      action={action}
      onSubmit={(e) => {
        if (!navigator.onLine) {
          e.preventDefault();
          window.alert(
            "You have no signal. Signing out needs the club's server, so you stay signed in for now. Whatever waits for camp sync stays on this device either way; sign out once you have signal.",
          );
          return;
        }
        localStorage.removeItem("lodebook-member");
      }}
    >
      <button type="submit" className="btn" disabled={pending}>
        Sign out
      </button>
    </form>
  );
}
