import { v7 as uuidv7 } from "uuid";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as getLedger } from "@/app/api/club/ledger/route";
import { POST as postPrice } from "@/app/api/club/prices/route";
import { POST as changePrice } from "@/app/api/club/prices/[id]/route";
import { PUT as putSettings } from "@/app/api/club/settings/route";
import { TROY_OUNCE_GRAMS } from "@/lib/estimate/units";
import type { Db } from "@/server/db";
import { pullAll } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

let db: Db;
let officer: string;
const none = { params: Promise.resolve({}) };
const body = (method: string, value: unknown) => ({ method, cookie: officer, headers: { "content-type": "application/json" }, body: JSON.stringify(value) });
const record = async (value: Record<string, unknown>) => {
  const res = await postPrice(req("/api/club/prices", body("POST", value)), none);
  return { status: res.status, json: await res.json() };
};
const change = async (id: string, value: unknown) => {
  const res = await changePrice(req(`/api/club/prices/${id}`, body("POST", value)), { params: Promise.resolve({ id }) });
  return { status: res.status, json: await res.json() };
};
const latestPrice = () =>
  db.$client
    .prepare("select id, price_per_troy_ounce p from reference_prices where withdrawn_at is null order by effective_on desc, created_at desc limit 1")
    .get() as { id: string; p: number };
const todayValue = async () =>
  (await (await getLedger(req("/api/club/ledger?price=today&pageSize=1", { cookie: officer }), none)).json()).summary as { value: number; fineGrams: number };

beforeAll(async () => {
  ({ db } = await seededDatabase());
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
});

describe("reference prices an officer can trust and correct (issue 15)", () => {
  it("refuses a date that is not on the calendar, naming the field", async () => {
    for (const effectiveOn of ["2026-02-30", "2026-13-01", "26-12-01"]) {
      const r = await record({ effectiveOn, pricePerTroyOunce: 2500, currency: "USD" });
      expect(r.status).toBe(400);
      expect(Object.keys(r.json.error.fields)).toContain("effectiveOn");
    }
  });

  it("keeps one club currency: a price in another is refused, saying which", async () => {
    const r = await record({ effectiveOn: "2026-11-20", pricePerTroyOunce: 2300, currency: "EUR" });
    expect(r.status).toBe(400);
    expect(r.json.error.fields.currency).toEqual(["must be USD"]);
    expect(r.json.error.message).toMatch(/USD/);
  });

  it("asks to confirm a price more than half away from the one in force then", async () => {
    const then = latestPrice().p;
    const typo = Math.round(then * 10); // an extra digit
    const first = await record({ effectiveOn: "2026-11-21", pricePerTroyOunce: typo, currency: "USD" });
    expect(first.status).toBe(409);
    expect(first.json.error.fields.pricePerTroyOunce[0]).toMatch(/900 % above/);
    const small = await record({ effectiveOn: "2026-11-21", pricePerTroyOunce: Math.round(then * 1.1), currency: "USD" });
    expect(small.status).toBe(201);
    const confirmed = await record({ effectiveOn: "2026-11-22", pricePerTroyOunce: Math.round(then * 1.1 * 1.6), currency: "USD", confirmJump: true });
    expect(confirmed.status).toBe(201);
  });

  it("a wrong price is replaced: the correction is in force, the mistake stays in the history, both audited", async () => {
    const wrong = latestPrice();
    const before = await todayValue();
    expect(before.value).toBeCloseTo((before.fineGrams / TROY_OUNCE_GRAMS) * wrong.p, 6);
    const fixed = Math.round(wrong.p / 1.6);
    const r = await change(wrong.id, {
      action: "replace",
      price: { effectiveOn: "2026-11-22", pricePerTroyOunce: fixed, currency: "USD", note: "typed 1.6 times too high", confirmJump: true },
    });
    expect(r.status).toBe(200);
    expect(r.json.withdrawn).toBe(wrong.id);
    const after = await todayValue();
    expect(after.value).toBeCloseTo((after.fineGrams / TROY_OUNCE_GRAMS) * fixed, 6);
    const rows = db.$client.prepare("select id, withdrawn_at w, replaces from reference_prices where id in (?, ?)").all(wrong.id, r.json.id) as {
      id: string;
      w: number | null;
      replaces: string | null;
    }[];
    expect(rows.find((x) => x.id === wrong.id)!.w).not.toBeNull();
    expect(rows.find((x) => x.id === r.json.id)!.replaces).toBe(wrong.id);
    const audit = db.$client.prepare("select action from audit_log where entity = 'price' order by rowid").all() as { action: string }[];
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(["price.record", "price.replace"]));
    // Replacing or withdrawing it again is refused.
    expect((await change(wrong.id, { action: "withdraw", note: "again" })).status).toBe(409);
  });

  it("a withdrawn price stops valuing finds and leaves members' devices", async () => {
    const member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
    const client = uuidv7();
    const first = await pullAll(member, client);
    const current = latestPrice();
    expect(first.changes.some((c) => c.entity === "price" && c.op === "put" && c.value.id === current.id)).toBe(true);
    expect((await change(current.id, { action: "withdraw", note: "entered for the wrong club" })).status).toBe(200);
    const next = await pullAll(member, client, first.cursor);
    expect(next.changes).toContainEqual(expect.objectContaining({ entity: "price", op: "del", id: current.id }));
    const after = await todayValue();
    expect(after.value).toBeCloseTo((after.fineGrams / TROY_OUNCE_GRAMS) * latestPrice().p, 6);
    expect((await change(uuidv7(), { action: "withdraw", note: "no such" })).status).toBe(404);
    expect((await change(current.id, { action: "withdraw", note: "" })).status).toBe(400);
  });

  it("the club's currency changes only once no price in another is in force", async () => {
    const put = (currency: string) =>
      putSettings(req("/api/club/settings", body("PUT", { name: "Quillmarsh Gulch Prospectors", currency, timeZone: "America/Los_Angeles" })), none);
    const refused = await put("EUR");
    expect(refused.status).toBe(409);
    expect((await refused.json()).error.message).toMatch(/in force in USD/);
    for (const p of db.$client.prepare("select id from reference_prices where withdrawn_at is null").all() as { id: string }[]) {
      expect((await change(p.id, { action: "withdraw", note: "the club now keeps euros" })).status).toBe(200);
    }
    expect((await put("EUR")).status).toBe(200);
    expect((await record({ effectiveOn: "2026-11-25", pricePerTroyOunce: 2300, currency: "EUR" })).status).toBe(201);
    const bad = await putSettings(req("/api/club/settings", body("PUT", { name: "Q", currency: "EUR", timeZone: "Mars/Olympus" })), none);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(["name", "timeZone"]);
  });
});
