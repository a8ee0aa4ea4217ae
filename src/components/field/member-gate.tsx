"use client";
import { useMemberState } from "@/client/member";
import { Skeleton } from "./skeleton";

/**
 * Draws a member screen's body once the member is known (the device's database opening, or a
 * new device asking the server who is signed in), and its fallback until then. What a screen
 * shows whoever the member is (its title, its main action, its lead) stays outside the gate, in
 * the page's own HTML: the first paint is the screen's shape, not grey bars.
 */
export function MemberGate({ children, fallback = <Skeleton /> }: { children: React.ReactNode; fallback?: React.ReactNode }) {
  return useMemberState().status === "ready" ? children : fallback;
}
