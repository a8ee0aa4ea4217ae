import { clubSettingsSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { clubSettings, saveClubSettings } from "@/server/club/settings";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

export const GET = route(async (req) => {
  await requireActor(req, "viewLedger", "club");
  return json(clubSettings());
});

/** The club's name, currency and time zone. */
export const PUT = route(async (req) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "managePrices", "club");
  const input = await parseJsonBody(req, clubSettingsSchema, "club_settings");
  return json(saveClubSettings(actor, input));
});
