"use client";
import { useActionState, useState } from "react";
import { FieldError } from "@/components/field-error";
import type { ActionState } from "@/server/action";
import { sendSignInLink, signInWithPassword } from "@/server/actions/session";

export function SignInForms({ from }: { from: string }) {
  const [mode, setMode] = useState<"password" | "link">("password");
  const [pwState, pwAction, pwPending] = useActionState<ActionState, FormData>(signInWithPassword, {});
  const [linkState, linkAction, linkPending] = useActionState<ActionState, FormData>(sendSignInLink, {});

  if (mode === "link") {
    return (
      <form action={linkAction} className="flex flex-col gap-4" noValidate>
        <input type="hidden" name="from" value={from} />
        <div>
          <label htmlFor="link-email" className="field-label">
            E-mail
          </label>
          <input id="link-email" name="email" type="email" autoComplete="email" required className="field-input" aria-invalid={!!linkState.fields?.email} />
          <FieldError messages={linkState.fields?.email} />
        </div>
        {linkState.message && (
          <p role="status" className={linkState.ok ? "font-bold text-moss" : "field-error"}>
            {linkState.message}
          </p>
        )}
        <button type="submit" className="btn btn-primary" disabled={linkPending}>
          {linkPending ? "Sending…" : "E-mail me a sign-in link"}
        </button>
        <button type="button" className="btn" onClick={() => setMode("password")}>
          Use my password instead
        </button>
      </form>
    );
  }

  return (
    <form action={pwAction} className="flex flex-col gap-4" noValidate>
      <input type="hidden" name="from" value={from} />
      <div>
        <label htmlFor="email" className="field-label">
          E-mail
        </label>
        <input id="email" name="email" type="email" autoComplete="username" required className="field-input" aria-invalid={!!pwState.fields?.email} />
        <FieldError messages={pwState.fields?.email} />
      </div>
      <div>
        <label htmlFor="password" className="field-label">
          Password
        </label>
        <input
          id="password"
          name="password"
          type="password"
          autoComplete="current-password"
          required
          className="field-input"
          aria-invalid={!!pwState.fields?.password}
        />
        <FieldError messages={pwState.fields?.password} />
      </div>
      {pwState.message && !pwState.ok && (
        <p role="alert" className="field-error">
          {pwState.message}
        </p>
      )}
      <button type="submit" className="btn btn-primary" disabled={pwPending}>
        {pwPending ? "Signing in…" : "Sign in"}
      </button>
      <button type="button" className="btn" onClick={() => setMode("link")}>
        E-mail me a link instead
      </button>
    </form>
  );
}
