import { v7 as uuidv7 } from "uuid";
import { GET as pullHandler } from "@/app/api/sync/pull/route";
import { POST as pushHandler } from "@/app/api/sync/push/route";
import { GET as uploadStatusHandler, PUT as chunkHandler } from "@/app/api/photos/[id]/upload/route";
import { estimateSpecimen } from "@/lib/estimate";
import type { Find } from "@/lib/entities/find";
import type { Outing } from "@/lib/entities/outing";
import { PROTOCOL_VERSION, type PullChange, type PullResponse, type PushResponse } from "@/lib/sync/protocol";
import { req } from "./test-db";

export type Mutation = { id: number; name: string; args: unknown };

export async function push(cookie: string, clientId: string, mutations: Mutation[], extra: Record<string, unknown> = {}) {
  const res = await pushHandler(
    req("/api/sync/push", {
      method: "POST",
      cookie,
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ protocolVersion: PROTOCOL_VERSION, clientId, mutations, ...extra }),
    }),
    {} as never,
  );
  return { status: res.status, body: (await res.json()) as PushResponse & { error?: { code: string; message: string; fields?: Record<string, string[]> } } };
}

export async function pull(cookie: string, clientId: string, cursor = 0, limit = 500, scope: "own" | "club" = "own") {
  const res = await pullHandler(
    req(`/api/sync/pull?protocolVersion=${PROTOCOL_VERSION}&clientId=${clientId}&cursor=${cursor}&limit=${limit}&scope=${scope}`, { cookie }),
    {} as never,
  );
  return { status: res.status, body: (await res.json()) as PullResponse };
}

/** Pulls every page from `cursor`, as a device does, and returns the changes and the final cursor. */
export async function pullAll(cookie: string, clientId: string, cursor = 0, limit = 500) {
  const changes: PullChange[] = [];
  for (;;) {
    const { body } = await pull(cookie, clientId, cursor, limit);
    changes.push(...body.changes);
    cursor = body.cursor;
    if (!body.more) return { changes, cursor, lastMutationId: body.lastMutationId };
  }
}

/** The state a device arrives at by applying changes in order: entity → id → record. */
export function applyChanges(changes: PullChange[], state = new Map<string, Map<string, Record<string, unknown>>>()) {
  for (const c of changes) {
    const table = state.get(c.entity) ?? new Map();
    state.set(c.entity, table);
    if (c.op === "put") table.set(c.value.id as string, c.value);
    else table.delete(c.id);
  }
  return state;
}

export const newOuting = (over: Partial<Outing> = {}): Outing => ({
  id: uuidv7(),
  claimId: null,
  startedAt: Date.UTC(2026, 6, 1, 7),
  endedAt: null,
  companions: "",
  method: "detecting",
  hours: null,
  conditions: "",
  notes: "",
  ...over,
});

export const newFind = (over: Partial<Find> = {}): Find => ({
  id: uuidv7(),
  outingId: null,
  claimId: null,
  kind: "specimen",
  weightGrams: 42.5,
  purity: null,
  depthCm: 20,
  method: "detecting",
  notes: "",
  lat: 41.8,
  lon: -117.62,
  accuracyM: 4,
  locationSource: "device",
  foundAt: Date.UTC(2026, 6, 1, 9),
  ...over,
});

export function newWeighIn(findId: string) {
  const input = {
    method: "hanging" as const,
    airGrams: [42.5],
    waterGrams: [26.1],
    finenessPermille: 825,
    finenessRangePermille: [700, 950] as [number, number],
  };
  return { id: uuidv7(), findId, input, deviceEstimate: estimateSpecimen(input), weighedAt: Date.UTC(2026, 6, 1, 18) };
}

/**
 * The device's `fetch` answered by the real route handlers, as the member with this cookie:
 * its sync engine runs against real SQLite without a server. Undo with vi.unstubAllGlobals().
 */
export function fetchToSyncHandlers(stubGlobal: (name: string, value: unknown) => unknown, cookie: () => string): void {
  stubGlobal("fetch", async (input: string, init?: RequestInit) => {
    const url = new URL(input, "http://localhost:3000");
    const request = req(url.pathname + url.search, { ...init, cookie: cookie() });
    if (url.pathname === "/api/sync/push") return pushHandler(request, {} as never);
    if (url.pathname === "/api/sync/pull") return pullHandler(request, {} as never);
    const upload = url.pathname.match(/^\/api\/photos\/([^/]+)\/upload$/);
    if (upload) return (request.method === "PUT" ? chunkHandler : uploadStatusHandler)(request, { params: Promise.resolve({ id: upload[1] }) });
    throw new TypeError(`no route for ${url.pathname} in this test`);
  });
}
