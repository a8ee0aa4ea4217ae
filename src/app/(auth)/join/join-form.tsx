"use client";
import { useActionState, useEffect, useState } from "react";
import { FieldError } from "@/components/field-error";
import type { ActionState } from "@/server/action";
import { invitationState, joinClub } from "@/server/actions/join";

/**
 * The invitation's token rides in the link's hash, so it never reaches a server log. The link
 * is checked as the page opens, so nobody fills in the form for a used or expired link; the
 * fields are the page's own state, so a refusal keeps what was typed.
 */
export function JoinForm() {
  const [token, setToken] = useState("");
  const [link, setLink] = useState<ActionState | null>(null);
  const [values, setValues] = useState({ name: "", password: "", confirm: "" });
  const [state, action, pending] = useActionState<ActionState, FormData>(joinClub, {});
  useEffect(() => {
    const found = new URLSearchParams(window.location.hash.slice(1)).get("token") ?? "";
    queueMicrotask(() => setToken(found));
    if (!found) {
      queueMicrotask(() => setLink({ ok: false, message: "This page needs the link from your invitation e-mail. Open the link from the e-mail." }));
      return;
    }
    const form = new FormData();
    form.set("token", found);
    void invitationState({}, form).then(setLink);
  }, []);

  if (link && !link.ok) {
    return (
      <p role="alert" className="field-error" data-testid="invitation-state">
        {link.message}
      </p>
    );
  }
  const field = (name: keyof typeof values, label: string, type: string, autoComplete: string) => (
    <label className="flex flex-col">
      <span className="field-label">{label}</span>
      <input
        name={name}
        type={type}
        autoComplete={autoComplete}
        className="field-input"
        value={values[name]}
        onChange={(e) => setValues({ ...values, [name]: e.target.value })}
        aria-invalid={!!state.fields?.[name]}
      />
      <FieldError messages={state.fields?.[name]} />
    </label>
  );
  return (
    <form action={action} className="flex flex-col gap-4" noValidate>
      {link?.ok && (
        <p className="font-bold" data-testid="invitation-state">
          {link.message}
        </p>
      )}
      <input type="hidden" name="token" value={token} />
      {field("name", "Your name", "text", "name")}
      {field("password", "Choose a password", "password", "new-password")}
      {field("confirm", "The same password again", "password", "new-password")}
      {state.message && !state.ok && (
        <p role="alert" className="field-error">
          {state.message}
        </p>
      )}
      <button type="submit" className="btn btn-primary" disabled={pending || !token || !link?.ok}>
        Join the club
      </button>
    </form>
  );
}
