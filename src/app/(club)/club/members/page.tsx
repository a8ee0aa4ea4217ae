import type { Metadata } from "next";
import { MembersAdmin } from "@/components/club/members-admin";
import { requirePageActor } from "@/server/auth/current";
import { formatDay } from "@/lib/format";
import { listOpenInvitations } from "@/server/club/members";
import { clubSettings } from "@/server/club/settings";
import { listMembers } from "@/server/queries/members";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage() {
  const actor = await requirePageActor("manageMembers", "/club/members");
  const { timeZone } = clubSettings();
  // Dates are written here, on the server, in the club's zone: the same text renders and hydrates.
  const invitations = listOpenInvitations().map((i) => ({ ...i, sentOn: formatDay(i.createdAt, timeZone), runsOutOn: formatDay(i.expiresAt, timeZone) }));
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Members</h1>
      <MembersAdmin members={listMembers()} invitations={invitations} selfId={actor.id} />
    </div>
  );
}
