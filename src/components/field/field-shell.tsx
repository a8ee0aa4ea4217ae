"use client";
import { MemberProvider, useMemberState } from "@/client/member";
import { SiteHeader } from "../site-header";
import { UpdatePrompt } from "../update-prompt";
import { Skeleton } from "./skeleton";
import { TabBar } from "./tab-bar";

function Body({ children }: { children: React.ReactNode }) {
  const state = useMemberState();
  return (
    <>
      <SiteHeader actor={state.status === "ready" ? state.member : null} />
      <main className="mx-auto max-w-5xl px-3 pb-24 pt-4 md:pb-8">{state.status === "ready" ? children : <Skeleton />}</main>
      {state.status === "ready" && <TabBar />}
      <UpdatePrompt />
    </>
  );
}

/** The member screens' frame: works offline, from what this device holds. */
export function FieldShell({ children }: { children: React.ReactNode }) {
  return (
    <MemberProvider>
      <Body>{children}</Body>
    </MemberProvider>
  );
}
