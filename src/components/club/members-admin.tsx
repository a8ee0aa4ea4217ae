"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/roles";
import { api, ApiError } from "./api";

type Member = { id: string; email: string; name: string | null; role: Role; active: boolean };
type Invitation = {
  id: string;
  email: string;
  role: Role;
  createdAt: number;
  expiresAt: number;
  acceptedAt: number | null;
  revokedAt: number | null;
  /** Written by the page on the server, in the club's zone. */
  sentOn: string;
  runsOutOn: string;
};

/** The roll (roles, deactivation) and invitations (send, resend, withdraw). */
export function MembersAdmin({ members, invitations, selfId }: { members: Member[]; invitations: Invitation[]; selfId: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [invite, setInvite] = useState({ email: "", role: "member" as Role });
  const act = async (fn: () => Promise<unknown>, done: string): Promise<boolean> => {
    try {
      await fn();
      setMessage({ ok: true, text: done });
      router.refresh();
      return true;
    } catch (error) {
      setMessage({ ok: false, text: error instanceof ApiError ? (Object.values(error.fields)[0]?.[0] ?? error.message) : String(error) });
      return false;
    }
  };
  const open = invitations;

  return (
    <div className="flex flex-col gap-4">
      {message && (
        <p role="status" className={message.ok ? "font-bold text-moss" : "field-error"}>
          {message.text}
        </p>
      )}
      <section className="sheet overflow-x-auto" aria-labelledby="roll">
        <h2 id="roll" className="heading-bar mb-2 text-lg">
          Club roll
        </h2>
        <table className="w-full text-left text-sm">
          <thead>
            <tr className="border-b-2 border-rule">
              <th className="py-2 pr-3">Name</th>
              <th className="py-2 pr-3">E-mail</th>
              <th className="py-2 pr-3">Role</th>
              <th className="py-2">Status</th>
            </tr>
          </thead>
          <tbody>
            {members.map((m) => (
              <tr key={m.id} className="border-b border-rule">
                <td className="py-2 pr-3 font-bold">{m.name ?? "—"}</td>
                <td className="py-2 pr-3">{m.email}</td>
                <td className="py-2 pr-3">
                  <label className="sr-only" htmlFor={`role-${m.id}`}>
                    Role of {m.name ?? m.email}
                  </label>
                  <select
                    id={`role-${m.id}`}
                    className="field-input w-auto"
                    value={m.role}
                    onChange={(e) => {
                      const role = e.target.value as Role;
                      if (
                        !window.confirm(
                          `Make ${m.name ?? m.email} ${ROLE_LABELS[role].toLowerCase()}? They are signed out on every device at once and sign in again with the new role.`,
                        )
                      )
                        return;
                      void act(() => api(`/api/club/members/${m.id}`, { method: "PATCH", body: { role } }), "Role changed; their old sessions have ended.");
                    }}
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABELS[r]}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="py-2">
                  {m.active ? "Active" : "Deactivated"}{" "}
                  {m.id !== selfId && (
                    <button
                      type="button"
                      className="btn ml-2 px-2 text-sm"
                      onClick={() => {
                        if (
                          m.active &&
                          !window.confirm(
                            `Deactivate ${m.name ?? m.email}? They are signed out on every device at once and cannot sign in; their records stay in the club's ledger. Changes still on their phone are not sent until they are active again.`,
                          )
                        )
                          return;
                        void act(
                          () => api(`/api/club/members/${m.id}`, { method: "PATCH", body: { active: !m.active } }),
                          m.active ? "Deactivated: their records stay, their sessions have ended." : "Active again.",
                        );
                      }}
                    >
                      {m.active ? "Deactivate" : "Reactivate"}
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section className="sheet flex flex-col gap-3" aria-labelledby="invite">
        <h2 id="invite" className="heading-bar self-start text-lg">
          Invite someone
        </h2>
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            // Cleared only once sent: a refusal keeps what was typed.
            void act(() => api("/api/club/invitations", { method: "POST", body: invite }), `Invitation sent to ${invite.email}.`).then(
              (sent) => sent && setInvite({ email: "", role: "member" }),
            );
          }}
        >
          <label className="flex flex-col">
            <span className="field-label">E-mail</span>
            <input type="email" className="field-input" value={invite.email} onChange={(e) => setInvite({ ...invite, email: e.target.value })} />
          </label>
          <label className="flex flex-col">
            <span className="field-label">As</span>
            <select className="field-input" value={invite.role} onChange={(e) => setInvite({ ...invite, role: e.target.value as Role })}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          </label>
          <button type="submit" className="btn btn-primary">
            Send the invitation
          </button>
        </form>
        <h3 className="font-bold">Waiting to be accepted</h3>
        {open.length === 0 ? (
          <p className="text-sm text-ink-soft">None.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {open.map((i) => (
              <li key={i.id} className="flex flex-wrap items-center gap-2">
                <span>
                  {i.email} · {ROLE_LABELS[i.role]} · sent {i.sentOn}, runs out {i.runsOutOn}
                </span>
                <button
                  type="button"
                  className="btn px-2 text-sm"
                  onClick={() =>
                    act(() => api(`/api/club/invitations/${i.id}`, { method: "POST", body: { action: "resend" } }), "Sent again with a fresh link.")
                  }
                >
                  Resend
                </button>
                <button
                  type="button"
                  className="btn px-2 text-sm"
                  onClick={() => act(() => api(`/api/club/invitations/${i.id}`, { method: "DELETE" }), "Invitation withdrawn.")}
                >
                  Withdraw
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
