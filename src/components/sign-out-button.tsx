"use client";
import { useActionState } from "react";
import { signOutNow } from "@/server/actions/session";

export function SignOutButton() {
  const [, action, pending] = useActionState(signOutNow, {});
  return (
    <form action={action}>
      <button type="submit" className="btn" disabled={pending}>
        Sign out
      </button>
    </form>
  );
}
