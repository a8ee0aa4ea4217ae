import { redirect } from "next/navigation";
import { ROLE_HOME } from "@/lib/roles";
import { currentActor } from "@/server/auth/current";

/** Where sign-in goes when no page was asked for: each role to its own home. */
export default async function SignedIn() {
  const actor = await currentActor();
  redirect(actor ? ROLE_HOME[actor.role] : "/sign-in");
}
