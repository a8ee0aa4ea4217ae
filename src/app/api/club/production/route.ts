import { z } from "zod";
import { requireActor } from "@/server/auth/actor";
import { productionByMonth } from "@/server/club/production";
import { json, parseSearchParams, route } from "@/server/http";

const querySchema = z.object({ season: z.coerce.number().int().min(2000).max(2100) }).strict();

export const GET = route(async (req) => {
  await requireActor(req, "viewLedger", "club");
  const { season } = parseSearchParams(req, querySchema, "production");
  return json({ season, months: productionByMonth(season) });
});
