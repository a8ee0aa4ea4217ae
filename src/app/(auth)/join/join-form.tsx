"use client";
import { useActionState, useEffect, useState } from "react";
import { FieldError } from "@/components/field-error";
import type { ActionState } from "@/server/action";
import { joinClub } from "@/server/actions/join";

/** The invitation's token rides in the link's hash, so it never reaches a server log. */
export function JoinForm() {
  const [token, setToken] = useState("");
  const [state, action, pending] = useActionState<ActionState, FormData>(joinClub, {});
  useEffect(() => {
    queueMicrotask(() => setToken(new URLSearchParams(window.location.hash.slice(1)).get("token") ?? ""));
  }, []);
  return (
    <form action={action} className="flex flex-col gap-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <label className="flex flex-col">
        <span className="field-label">Your name</span>
        <input name="name" autoComplete="name" className="field-input" aria-invalid={!!state.fields?.name} />
        <FieldError messages={state.fields?.name} />
      </label>
      <label className="flex flex-col">
        <span className="field-label">Choose a password</span>
        <input name="password" type="password" autoComplete="new-password" className="field-input" aria-invalid={!!state.fields?.password} />
        <FieldError messages={state.fields?.password} />
      </label>
      <label className="flex flex-col">
        <span className="field-label">The same password again</span>
        <input name="confirm" type="password" autoComplete="new-password" className="field-input" aria-invalid={!!state.fields?.confirm} />
        <FieldError messages={state.fields?.confirm} />
      </label>
      {state.message && !state.ok && (
        <p role="alert" className="field-error">
          {state.message}
        </p>
      )}
      <button type="submit" className="btn btn-primary" disabled={pending || !token}>
        Join the club
      </button>
    </form>
  );
}
