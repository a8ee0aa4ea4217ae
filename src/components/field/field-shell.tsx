"use client";
import { usePathname } from "next/navigation";
import { useAfterFirstPaint } from "@/client/first-paint";
import { MemberProvider, useMemberState } from "@/client/member";
import { lazy, Suspense } from "react";
import { SiteHeader } from "../site-header";
import { TabBar } from "./tab-bar";

// Asked once, on the home screen: loaded once the screen has drawn its first words, so no
// screen's first load carries it.
const StoragePrompt = lazy(() => import("../storage-prompt").then((m) => ({ default: m.StoragePrompt })));

// Shows only when a new version waits: loaded once the page has drawn its first words, never
// in a first load.
const UpdatePrompt = lazy(() => import("../update-prompt").then((m) => ({ default: m.UpdatePrompt })));

function Body({ children }: { children: React.ReactNode }) {
  const state = useMemberState();
  const path = usePathname();
  const painted = useAfterFirstPaint();
  return (
    <>
      <SiteHeader actor={state.status === "ready" ? state.member : null} />
      {/* --tab-bar-room: what the phone's tab bar covers at the bottom, for what sticks there. */}
      <main className="mx-auto max-w-5xl px-3 pb-24 pt-4 [--tab-bar-room:3.5rem] md:pb-8 md:[--tab-bar-room:0px]">
        {state.status === "ready" && path === "/" && painted && (
          <Suspense fallback={null}>
            <StoragePrompt />
          </Suspense>
        )}
        {children}
      </main>
      {state.status === "ready" && <TabBar />}
      {painted && (
        <Suspense fallback={null}>
          <UpdatePrompt />
        </Suspense>
      )}
    </>
  );
}

/**
 * The member screens' frame: works offline, from what this device holds. Each page gates its
 * own body on the member (FieldScreen, MemberGate), so its head is in the HTML.
 */
export function FieldShell({ children }: { children: React.ReactNode }) {
  return (
    <MemberProvider>
      <Body>{children}</Body>
    </MemberProvider>
  );
}
