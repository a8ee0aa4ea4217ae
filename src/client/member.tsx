"use client";
import { useRouter } from "next/navigation";
import { createContext, startTransition, useContext, useEffect, useState } from "react";
import type { Role } from "@/lib/roles";
import { checkDatePatternLater, keepDatePattern } from "./date-pattern-store";
import { memberDb, type LodebookDb } from "./device-db";
import { loadValidation } from "./logbook";
import { startSync } from "./sync/scheduler";

export type DeviceMember = { id: string; name: string | null; email: string; role: Role };

const STORAGE_KEY = "lodebook-member";

export function rememberedMember(): DeviceMember | null {
  try {
    return JSON.parse(localStorage.getItem(STORAGE_KEY) ?? "null") as DeviceMember | null;
  } catch {
    return null;
  }
}

export function forgetMember(): void {
  localStorage.removeItem(STORAGE_KEY);
}

/** The answer to "who is signed in": the one the page asked for while parsing (layout.tsx), else a new request. */
function askWho(): Promise<Response | null> {
  const w = window as Window & { __lodebookMe?: Promise<Response | null> };
  const early = w.__lodebookMe;
  delete w.__lodebookMe;
  return early ?? fetch("/api/me", { cache: "no-store", credentials: "same-origin" });
}

type State = { status: "loading" } | { status: "signed-out" } | { status: "ready"; member: DeviceMember; db: LodebookDb; sessionLive: boolean };

const MemberContext = createContext<State>({ status: "loading" });

/**
 * Who is using this device, known without signal: the member the last signed-in visit
 * remembered, confirmed with the server when it answers. Each member has their own database.
 */
export function MemberProvider({ children }: { children: React.ReactNode }) {
  const [state, setState] = useState<State>({ status: "loading" });

  useEffect(() => {
    let cancelled = false;
    // The screen behind the member is drawn as a transition: in slices that leave room for a
    // tap, not as one block of the main thread at start (see live-query.ts). The member's
    // database is set up (Dexie reading its four schema versions) in a task of its own, not in
    // the one that read the server's answer or mounted the page.
    const use = (member: DeviceMember, sessionLive: boolean) =>
      setTimeout(() => {
        if (cancelled) return;
        const db = memberDb(member.id);
        startTransition(() => setState({ status: "ready", member, db, sessionLive }));
      }, 0);
    // Dates are written from the pattern kept for this browser's language (date-pattern-store.ts),
    // checked against the browser's own Intl once it is idle.
    keepDatePattern();
    let stopCheck = () => {};
    const remembered = rememberedMember();
    if (remembered) use(remembered, false);
    askWho()
      .then(async (res) => {
        if (!res) throw new Error("no answer");
        if (res.ok) {
          const { member, datePattern } = (await res.json()) as { member: DeviceMember; datePattern?: unknown };
          localStorage.setItem(STORAGE_KEY, JSON.stringify(member));
          keepDatePattern(datePattern ?? null);
          use(member, true);
        } else if (res.status === 401 && !remembered && !cancelled) {
          setState({ status: "signed-out" });
        }
      })
      .catch(() => {
        if (!remembered && !cancelled) setState({ status: "signed-out" });
      })
      .finally(() => {
        if (!cancelled) stopCheck = checkDatePatternLater();
      });
    return () => {
      cancelled = true;
      stopCheck();
    };
  }, []);

  const ready = state.status === "ready" ? state : undefined;
  useEffect(() => {
    if (!ready) return;
    const sync = startSync(ready.db, ready.member.id);
    // The validator (zod and every entity schema, a few hundred milliseconds of evaluation on a
    // mid-range phone) comes in its own chunk. It is loaded at the member's first touch or key,
    // which comes before any save, rather than at start, where it held the main thread while
    // the first screen and the first camp sync needed it. Saves await it too; a failure here
    // shows again, with its reason, at that save.
    const warm = () => {
      stopWarming();
      void loadValidation().catch(() => undefined);
    };
    const events = ["pointerdown", "keydown", "focusin"] as const;
    const stopWarming = () => events.forEach((e) => window.removeEventListener(e, warm, true));
    events.forEach((e) => window.addEventListener(e, warm, { capture: true, passive: true }));
    return () => {
      stopWarming();
      sync.stop();
    };
  }, [ready?.db, ready?.member.id]); // eslint-disable-line react-hooks/exhaustive-deps

  const router = useRouter();
  useEffect(() => {
    if (state.status === "signed-out") router.replace(`/sign-in?from=${encodeURIComponent(window.location.pathname)}`);
  }, [state.status, router]);

  return <MemberContext.Provider value={state}>{children}</MemberContext.Provider>;
}

export function useMemberState(): State {
  return useContext(MemberContext);
}

/** For screens inside the member shell, once the member is known. */
export function useMember(): { member: DeviceMember; db: LodebookDb } {
  const state = useContext(MemberContext);
  if (state.status !== "ready") throw new Error("useMember outside a ready member shell");
  return state;
}
