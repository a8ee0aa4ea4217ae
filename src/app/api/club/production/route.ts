import { z } from "zod";
import { wholeNumber } from "@/lib/web/whole-number";
import { requireActor } from "@/server/auth/actor";
import { productionByMonth } from "@/server/club/production";
import { json, parseSearchParams, route } from "@/server/http";

const querySchema = z.object({ season: wholeNumber("season", 2000, 2100) }).strict();

export const GET = route(async (req) => {
  await requireActor(req, "viewLedger", "club");
  const { season } = parseSearchParams(req, querySchema, "production");
  return json({ season, months: productionByMonth(season) });
});
