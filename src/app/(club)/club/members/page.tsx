import type { Metadata } from "next";
import { MembersAdmin } from "@/components/club/members-admin";
import { requirePageActor } from "@/server/auth/current";
import { listOpenInvitations } from "@/server/club/members";
import { listMembers } from "@/server/queries/members";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage() {
  const actor = await requirePageActor("manageMembers", "/club/members");
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Members</h1>
      <MembersAdmin members={listMembers()} invitations={listOpenInvitations()} selfId={actor.id} />
    </div>
  );
}
