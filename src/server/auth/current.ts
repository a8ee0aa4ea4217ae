import "server-only";
import { redirect } from "next/navigation";
import { can, type Capability } from "@/lib/roles";
import { auth } from ".";
import { loadActor, type Actor } from "./actor";

/** The signed-in member for server components and actions, checked against the database. */
export async function currentActor(): Promise<Actor | null> {
  const session = await auth();
  return loadActor(session?.user?.id, (session as { sv?: unknown } | null)?.sv);
}

/** For pages: send the visitor to sign in, or home when the role lacks the capability. */
export async function requirePageActor(capability?: Capability, from = "/"): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect(`/sign-in?from=${encodeURIComponent(from)}`);
  if (capability && !can(actor.role, capability)) redirect("/?denied=1");
  return actor;
}
