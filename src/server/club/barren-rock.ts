import "server-only";
import { and, asc, eq, gte, isNull, lt } from "drizzle-orm";
import { proposeHostDensity } from "@/lib/figures/host-proposal";
import { seasonBounds } from "@/lib/season";
import { getDb } from "../db";
import * as t from "../db/schema";
import { AppError } from "../errors";
import { clubSettings } from "./settings";

/**
 * A claim's barren-rock weigh-ins of a season (weighed on the club's days of that year), each
 * with the server's density, and the host density they propose (lib/figures/host-proposal.ts).
 */
export function claimBarrenRock(claimId: string, season: number) {
  const db = getDb();
  if (!db.select({ id: t.claims.id }).from(t.claims).where(eq(t.claims.id, claimId)).get()) throw new AppError("not_found:claim", "No such claim.");
  const { timeZone } = clubSettings();
  const { start, end } = seasonBounds(season, timeZone);
  const pieces = db
    .select({
      id: t.barrenRocks.id,
      memberName: t.members.name,
      weighedAt: t.barrenRocks.weighedAt,
      density: t.barrenRocks.density,
      scaleCheckPassed: t.barrenRocks.scaleCheckPassed,
    })
    .from(t.barrenRocks)
    .innerJoin(t.members, eq(t.members.id, t.barrenRocks.memberId))
    .where(and(eq(t.barrenRocks.claimId, claimId), isNull(t.barrenRocks.deletedAt), gte(t.barrenRocks.weighedAt, start), lt(t.barrenRocks.weighedAt, end)))
    .orderBy(asc(t.barrenRocks.weighedAt))
    .all();
  return { season, timeZone, pieces, proposal: proposeHostDensity(pieces.map((p) => p.density)) };
}
