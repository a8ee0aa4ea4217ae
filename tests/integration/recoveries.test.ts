import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { v7 as uuidv7 } from "uuid";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { PUT as putProfile } from "@/app/api/club/claims/[id]/profile/route";
import { GET as getRecoveries, POST as postRecovery } from "@/app/api/club/recoveries/route";
import { GET as getDocument, PUT as putDocument } from "@/app/api/club/recoveries/[id]/document/route";
import type { Db } from "@/server/db";
import { newFind, pullAll, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

let db: Db;
let officer: string;
let member: string;
let claimId: string;
let otherClaimId: string;
let dir: string;
const none = { params: Promise.resolve({}) };
const json = (method: string, body: unknown, cookie = officer) => ({
  method,
  cookie,
  headers: { "content-type": "application/json" },
  body: JSON.stringify(body),
});

beforeAll(async () => {
  ({ db } = await seededDatabase());
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-recoveries-"));
  vi.stubEnv("LODEBOOK_PHOTO_DIR", dir);
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  [claimId, otherClaimId] = (db.$client.prepare("select id from claims where kind = 'placer' order by name").all() as { id: string }[]).map((c) => c.id);
});
afterAll(() => {
  vi.unstubAllEnvs();
  fs.rmSync(dir, { recursive: true, force: true });
});

/** Nuggets on the claim, pushed by the member; their weights sum to `total`. */
async function nuggets(weights: number[], claim = claimId) {
  const finds = weights.map((w) => ({ ...newFind(), kind: "nugget" as const, claimId: claim, weightGrams: w, foundAt: Date.UTC(2026, 7, 10) }));
  const res = await push(
    member,
    uuidv7(),
    finds.map((f, i) => ({ id: i + 1, name: "find.put", args: f })),
  );
  expect(res.body.results.every((r) => r.status === "applied")).toBe(true);
  return finds.map((f) => f.id);
}
const record = async (body: Record<string, unknown>) => {
  const res = await postRecovery(req("/api/club/recoveries", json("POST", { claimId, recordedOn: "2026-09-01", ...body })), none);
  return { status: res.status, body: await res.json() };
};
const figure = (id: string) =>
  db.$client.prepare("select fine_basis basis, latest_fine_grams fine from finds where id = ?").get(id) as { basis: string; fine: number };

describe("what the club recovers (issue 15)", () => {
  it("a melt shares its fine gold among the finds by their estimates; they are figured from it from then on", async () => {
    const ids = await nuggets([60, 40]);
    const before = ids.map((id) => figure(id).fine);
    const r = await record({ kind: "melt", fineGrams: 88, findIds: ids });
    expect(r.status).toBe(201);
    expect(r.body.estimatedGrams).toBeCloseTo(before[0] + before[1], 9);
    const after = ids.map(figure);
    expect(after.map((a) => a.basis)).toEqual(["assay", "assay"]);
    expect(after[0].fine + after[1].fine).toBeCloseTo(88, 9);
    expect(after[0].fine / after[1].fine).toBeCloseTo(before[0] / before[1], 9);
    // The member's devices pull the new figures.
    const pulled = (await pullAll(member, uuidv7())).changes.filter((c) => c.entity === "find" && c.op === "put" && ids.includes(c.value.id as string));
    expect(pulled.map((c) => (c.op === "put" ? c.value.fineBasis : null))).toEqual(["assay", "assay"]);
  });

  it("proposes the claim's fineness from its melts (two melts, checked by hand) and compares recovered with estimated", async () => {
    // Already: 100 g melted → 88 g (880 ‰). Now 50 g → 46 g (920 ‰).
    // mean (100·880 + 50·920) / 150 = 893.3 ‰; ± 2 sd = ± 37.7 ‰ → 855.6–931.0 ‰
    await record({ kind: "melt", fineGrams: 46, findIds: await nuggets([30, 20]) });
    const res = await getRecoveries(req(`/api/club/recoveries?claimId=${claimId}&season=2026`, { cookie: officer }), none);
    const body = await res.json();
    expect(body.recoveries).toHaveLength(2);
    expect(body.proposal.low).toBeCloseTo(855.6, 1);
    expect(body.proposal.high).toBeCloseTo(931.0, 1);
    expect(body.comparison.ratios).toHaveLength(2);
    // Accepting it: later finds on the claim are figured with it.
    const put = await putProfile(
      req(
        `/api/club/claims/${claimId}/profile`,
        json("PUT", {
          finenessLow: body.proposal.low,
          finenessHigh: body.proposal.high,
          finenessSource: "Proposed from 2 melts of 2026",
          hostDensityLow: 2.62,
          hostDensityHigh: 2.68,
          hostDensitySource: "Club preset",
        }),
      ),
      { params: Promise.resolve({ id: claimId }) },
    );
    expect(put.status).toBe(200);
    const [later] = await nuggets([10]);
    expect(figure(later).fine).toBeCloseTo((10 * (body.proposal.low + body.proposal.high)) / 2 / 1000, 9);
  });

  it("refuses finds from another claim, a find already melted, an assay of two finds, and unknown finds, naming the field", async () => {
    const [mine] = await nuggets([5]);
    const [theirs] = await nuggets([5], otherClaimId);
    const melted = (db.$client.prepare("select find_id id from recovery_finds limit 1").get() as { id: string }).id;
    for (const [body, status] of [
      [{ kind: "melt", fineGrams: 4, findIds: [mine, theirs] }, 400],
      [{ kind: "melt", fineGrams: 4, findIds: [mine, melted] }, 409],
      [{ kind: "assay", fineGrams: 4, fineness: 900, findIds: [mine, uuidv7()] }, 400],
      [{ kind: "melt", fineGrams: 4, findIds: [uuidv7()] }, 400],
      [{ kind: "assay", fineGrams: 4, findIds: [mine] }, 400],
    ] as const) {
      const r = await record(body);
      expect(r.status, JSON.stringify(body)).toBe(status);
      expect(Object.keys(r.body.error.fields ?? {}).length).toBeGreaterThan(0);
    }
    expect(figure(mine).basis).toBe("claim_fineness");
  });

  it("keeps the melt's document: a PDF or an image by its bytes, served to officers only as a download", async () => {
    const r = await record({ kind: "assay", fineGrams: 4.4, fineness: 910, findIds: await nuggets([4.8]) });
    const id = r.body.id as string;
    const put = (bytes: string, cookie = officer) =>
      putDocument(req(`/x`, { method: "PUT", cookie, headers: { "content-type": "application/pdf", "x-file-name": "assay <report>.pdf" }, body: bytes }), {
        params: Promise.resolve({ id }),
      });
    expect((await put("<html><script>alert(1)</script></html>")).status).toBe(415);
    expect((await put("%PDF-1.4\n% an invented assay report\n", member)).status).toBe(403);
    expect((await put("%PDF-1.4\n% an invented assay report\n")).status).toBe(200);
    const res = await getDocument(req("/x", { cookie: officer }), { params: Promise.resolve({ id }) });
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toBe('attachment; filename="assay _report_.pdf"');
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect((await getDocument(req("/x", { cookie: member }), { params: Promise.resolve({ id }) })).status).toBe(403);
  });
});
