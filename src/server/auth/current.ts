import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { can, type Capability } from "@/lib/roles";
import { actorFromHeaders, type Actor } from "./actor";

/** The signed-in member for server components and actions, read as route handlers read it. */
export async function currentActor(): Promise<Actor | null> {
  return actorFromHeaders(await headers());
}

/** For pages: send the visitor to sign in, or home when the role lacks the capability. */
export async function requirePageActor(capability?: Capability, from = "/"): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect(`/sign-in?from=${encodeURIComponent(from)}`);
  if (capability && !can(actor.role, capability)) redirect("/?denied=1");
  return actor;
}
