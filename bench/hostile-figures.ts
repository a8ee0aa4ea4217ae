import { v7 as uuidv7 } from "uuid";
import { PROTOCOL_VERSION } from "../src/lib/sync/version";
import { percentile, report } from "./stats";

type Member = { id: string; cookie: string };

/** Members with a few thousand finds each: a sharing change re-sends them all. */
export function seedHeavyMembers(sqlite: import("better-sqlite3").Database, count: number, findsEach: number): string[] {
  const ids = Array.from({ length: count }, () => uuidv7());
  const member = sqlite.prepare("insert into members (id, email, name, role, active) values (?, ?, ?, 'member', 1)");
  const find = sqlite.prepare("insert into finds (id, member_id, kind, method, found_at, seq) values (?, ?, 'flakes', 'panning', ?, 0)");
  sqlite.transaction(() => {
    ids.forEach((id, i) => {
      member.run(id, `heavy${i}@quillmarsh.example`, `Heavy ${i}`);
      for (let f = 0; f < findsEach; f++) find.run(uuidv7(), id, 1780000000000 + f);
    });
  })();
  return ids;
}

const json = (baseUrl: string, cookie: string, body: unknown, from?: string) => ({
  method: "POST",
  headers: { "content-type": "application/json", cookie, origin: baseUrl, ...(from ? { "x-forwarded-for": from } : {}) },
  body: JSON.stringify(body),
});

/** Hostile traffic until `stop()` is true; returns how many requests each kind sent. */
function attack(baseUrl: string, heavy: Member[], stop: () => boolean) {
  const sent = { settings: 0, signIns: 0, chunked: 0, cut: 0 };
  // A hostile request the server cuts off (a reset connection) is counted, not fatal: the
  // bystander is what is measured.
  const cut = () => {
    sent.cut++;
  };
  const loops: Promise<void>[] = [];
  // 500 sharing changes per push, from members with thousands of finds.
  // Each hostile member from an address of its own (behind the one trusted proxy), as the
  // bystander has its own: per-address limits are not what is measured here.
  heavy.forEach((m, k) => {
    loops.push(
      (async () => {
        while (!stop()) {
          const mutations = Array.from({ length: 500 }, (_, i) => ({ id: i + 1, name: "settings.put", args: { locationSharing: i % 2 ? "exact" : "claim" } }));
          await fetch(
            `${baseUrl}/api/sync/push`,
            json(baseUrl, m.cookie, { protocolVersion: PROTOCOL_VERSION, clientId: uuidv7(), mutations }, `198.19.0.${k + 1}`),
          )
            .then((r) => r.arrayBuffer())
            .catch(cut);
          sent.settings++;
        }
      })(),
    );
  });
  // A burst of password guesses from many addresses (behind the one trusted proxy).
  loops.push(
    (async () => {
      const csrf = await fetch(`${baseUrl}/api/auth/csrf`);
      const cookie = csrf.headers
        .getSetCookie()
        .map((c) => c.split(";")[0])
        .join("; ");
      const { csrfToken } = (await csrf.json()) as { csrfToken: string };
      let n = 0;
      while (!stop()) {
        await Promise.all(
          Array.from({ length: 24 }, () => {
            n++;
            const body = new URLSearchParams({ email: `guess${n % 500}@quillmarsh.example`, password: `guess-${n}`, csrfToken });
            return fetch(`${baseUrl}/api/auth/callback/credentials`, {
              method: "POST",
              redirect: "manual",
              headers: { "content-type": "application/x-www-form-urlencoded", cookie, "x-forwarded-for": `198.18.${(n >> 8) & 255}.${n & 255}` },
              body,
            })
              .then((r) => r.arrayBuffer())
              .catch(cut);
          }),
        );
        sent.signIns += 24;
      }
    })(),
  );
  // Large chunked bodies with no declared length.
  for (let k = 0; k < 3; k++) {
    loops.push(
      (async () => {
        while (!stop()) {
          let pushed = 0;
          const body = new ReadableStream<Uint8Array>({
            pull(c) {
              if (pushed >= 12 * 1024 * 1024) return c.close();
              pushed += 65536;
              c.enqueue(new Uint8Array(65536).fill(0x20));
            },
          });
          await fetch(`${baseUrl}/api/sync/push`, {
            method: "POST",
            headers: { "content-type": "application/json", cookie: heavy[k % heavy.length].cookie, origin: baseUrl, "x-forwarded-for": `198.19.1.${k + 1}` },
            body,
            duplex: "half",
          } as RequestInit)
            .then((r) => r.arrayBuffer())
            .catch(cut);
          sent.chunked++;
        }
      })(),
    );
  }
  return { sent, done: Promise.all(loops) };
}

/**
 * The bystander's own address (behind the one trusted proxy), as each member has theirs: the
 * bench's earlier lines push from the loopback address, and its per-address limit is theirs.
 */
const BYSTANDER_ADDRESS = "198.20.0.1";

/**
 * A member's ordinary requests, one after another: who they are three times, then a find
 * pushed (a phone asks far more than it pushes; 105 pushes in the run stay under the
 * per-account push limit of 120 a minute, so the bystander's errors are the attack's doing).
 */
async function bystanderRequests(baseUrl: string, member: Member, count: number) {
  const latencies: number[] = [];
  let errors = 0;
  const statuses = new Set<number>();
  const clientId = uuidv7();
  for (let i = 0; i < count; i++) {
    const t = performance.now();
    const res =
      i % 4 !== 3
        ? await fetch(`${baseUrl}/api/me`, { headers: { cookie: member.cookie, "x-forwarded-for": BYSTANDER_ADDRESS } })
        : await fetch(
            `${baseUrl}/api/sync/push`,
            json(
              baseUrl,
              member.cookie,
              {
                protocolVersion: PROTOCOL_VERSION,
                clientId,
                mutations: [
                  {
                    id: (i + 1) / 4,
                    name: "find.put",
                    args: {
                      id: uuidv7(),
                      outingId: null,
                      claimId: null,
                      kind: "nugget",
                      weightGrams: 1.2,
                      depthCm: null,
                      method: "detecting",
                      notes: "",
                      lat: null,
                      lon: null,
                      accuracyM: null,
                      locationSource: null,
                      foundAt: 1780000000000 + i,
                    },
                  },
                ],
              },
              BYSTANDER_ADDRESS,
            ),
          );
    await res.arrayBuffer();
    if (res.status !== 200) {
      errors++;
      statuses.add(res.status);
    }
    latencies.push(performance.now() - t);
  }
  return { latencies, errors, statuses };
}

/**
 * RELIABILITY 34: a bystander's p99 while hostile traffic runs (big settings pushes, a burst of
 * sign-ins, large chunked bodies), beside the same bystander on a quiet server in this run.
 */
export async function bystander(baseUrl: string, member: Member, heavy: Member[]) {
  const quiet = await bystanderRequests(baseUrl, member, 120);
  let stopping = false;
  const hostile = attack(baseUrl, heavy, () => stopping);
  await new Promise((r) => setTimeout(r, 500)); // let every hostile loop get going
  const loud = await bystanderRequests(baseUrl, member, 300);
  stopping = true;
  await hostile.done;
  const p99 = percentile(loud.latencies, 99);
  const quietP99 = percentile(quiet.latencies, 99);
  const s = hostile.sent;
  report(
    `bystander under hostile traffic (${s.settings} pushes of 500 sharing changes, ${s.signIns} sign-in guesses, ${s.chunked} chunked 12 MB bodies; ${s.cut} hostile requests cut off, ${loud.errors} bystander errors${loud.errors ? ` (${[...loud.statuses].join(", ")})` : ""})`,
    {
      value: [p99],
      unit: "ms p99",
      ratio: [p99 / quietP99],
      ratioLabel: `× the quiet p99 (${quietP99.toFixed(1)} ms)`,
      goal: "p99 ≤ 250 ms and 0 errors",
      pass: p99 <= 250 && loud.errors === 0 && quiet.errors === 0,
    },
  );
}
