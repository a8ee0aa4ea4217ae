"use client";
import { usePathname } from "next/navigation";
import { MemberProvider, useMemberState } from "@/client/member";
import { lazy, Suspense } from "react";
import { IntentLink } from "../intent-link";
import { SiteHeader } from "../site-header";
import { HeadOutCaution } from "./head-out-caution";
import { Skeleton } from "./skeleton";
import { TabBar } from "./tab-bar";

// Asked once, on the home screen: loaded after it, so no screen's first load carries it.
const StoragePrompt = lazy(() => import("../storage-prompt").then((m) => ({ default: m.StoragePrompt })));

// Shows only when a new version waits: loaded just after the frame, never in a first load.
const UpdatePrompt = lazy(() => import("../update-prompt").then((m) => ({ default: m.UpdatePrompt })));

/**
 * Home's first frame, in the page's own HTML: the greeting, the main action and the field
 * caution, drawn before the member is known (the device's database opening, or a new device
 * asking the server who is signed in). The caution is the screen's largest text and Today
 * shows it at the same size, so the first paint is the largest one; a phone on camp signal
 * sees the screen's shape at once instead of grey bars.
 */
function HomeFrame() {
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-2xl font-bold">Good day</h1>
      <IntentLink href="/finds/new" className="btn btn-primary min-h-[64px] text-xl">
        Log a find
      </IntentLink>
      <Skeleton lines={3} />
      <HeadOutCaution />
    </div>
  );
}

function Body({ children }: { children: React.ReactNode }) {
  const state = useMemberState();
  const path = usePathname();
  return (
    <>
      <SiteHeader actor={state.status === "ready" ? state.member : null} />
      <main className="mx-auto max-w-5xl px-3 pb-24 pt-4 md:pb-8">
        {state.status === "ready" && path === "/" && (
          <Suspense fallback={null}>
            <StoragePrompt />
          </Suspense>
        )}
        {state.status === "ready" ? children : path === "/" ? <HomeFrame /> : <Skeleton />}
      </main>
      {state.status === "ready" && <TabBar />}
      <Suspense fallback={null}>
        <UpdatePrompt />
      </Suspense>
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
