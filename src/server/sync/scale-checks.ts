import "server-only";
import { EstimateInputError } from "@/lib/estimate/errors";
import { judgeSetupCheck, measureDensity, type DensityInput } from "@/lib/estimate/setup-check";
import type { ScaleCheckRef, SetupCheck } from "@/lib/entities/scale";
import { statement, type Sqlite } from "../db/rows";
import { logger } from "../log";
import { RejectError } from "./reject";

// The server's own verdicts on setup checks and its own densities of barren rock: recomputed
// with the engine, as a weigh-in's estimate is. A device that disagrees is logged, not obeyed.

function engineRefusal(error: unknown, under: string): never {
  if (error instanceof EstimateInputError) throw new RejectError("estimate_input", error.message, `${under}.${error.field}`);
  throw error;
}

/** Each check's verdict again; the latest (by when it was made) is the scale's standing. */
export function judgeChecks(scaleId: string, checks: readonly SetupCheck[]): { latestCheckPassed: boolean | null; latestCheckedAt: number | null } {
  let latest: { at: number; passed: boolean } | null = null;
  checks.forEach((c, i) => {
    let passed: boolean;
    try {
      passed = judgeSetupCheck(c.input as DensityInput, c.reference).passed;
    } catch (error) {
      engineRefusal(error, `checks.${i}.input`);
    }
    if (passed !== c.result.passed) logger.warn({ code: "check_mismatch", scale: scaleId, check: c.id }, "device's setup-check verdict differs");
    if (!latest || c.checkedAt >= latest.at) latest = { at: c.checkedAt, passed };
  });
  const l = latest as { at: number; passed: boolean } | null;
  return { latestCheckPassed: l ? l.passed : null, latestCheckedAt: l ? l.at : null };
}

/**
 * The verdict on the setup check a weigh-in names: the scale must be the member's (a deleted
 * one too: the weighing was made before), and the check one of its own; null when none is named.
 */
export function namedCheckVerdict(db: Sqlite, memberId: string, scaleId: string | null, check: ScaleCheckRef | null): boolean | null {
  if (scaleId === null) {
    if (check !== null) throw new RejectError("invalid", "A scale's check needs the scale it was made on.", "scaleId");
    return null;
  }
  const row = statement(db, "select member_id from scales where id = ?").raw().get(scaleId) as [string] | undefined;
  if (!row || row[0] !== memberId) throw new RejectError("unknown_parent", "The scale this was weighed on is not on the server.", "scaleId");
  if (check === null) return null;
  const found = statement(db, "select c.value from scales s, json_each(s.checks) c where s.id = ? and json_extract(c.value, '$.id') = ?")
    .raw()
    .get(scaleId, check.id) as [string] | undefined;
  if (!found) throw new RejectError("unknown_parent", "That setup check is not in the scale's history on the server.", "scaleCheck");
  const stored = JSON.parse(found[0]) as SetupCheck;
  try {
    return judgeSetupCheck(stored.input as DensityInput, stored.reference).passed;
  } catch (error) {
    engineRefusal(error, "scaleCheck");
  }
}

/** A barren-rock piece's density as the server's engine gives it. */
export function serverDensity(input: DensityInput, deviceDensity: number, id: string): number {
  let density: number;
  try {
    density = measureDensity(input).density;
  } catch (error) {
    engineRefusal(error, "input");
  }
  if (density !== deviceDensity) logger.warn({ code: "density_mismatch", barrenRock: id }, "device's density differs");
  return density;
}
