import type { PullResponse, PushResponse } from "@/lib/sync/protocol";
import { PROTOCOL_VERSION } from "@/lib/sync/version";

export type Answer<T> =
  | { ok: true; body: T }
  | {
      ok: false;
      kind: "offline" | "unauthorized" | "other-member" | "outdated" | "gap" | "reused" | "retry" | "refused";
      expected?: number;
      message?: string;
      retryAfterS?: number;
      /** For "reused": the mutation ids the server holds with this content (done). */
      replayed?: number[];
      /** A failure of the server itself (500), with the id its log keeps it under. */
      errorId?: string;
    };

async function call<T>(input: string, init?: RequestInit): Promise<Answer<T>> {
  let res: Response;
  try {
    res = await fetch(input, { ...init, credentials: "same-origin", cache: "no-store" });
  } catch {
    return { ok: false, kind: "offline" };
  }
  if (res.ok) return { ok: true, body: (await res.json()) as T };
  const body = (await res.json().catch(() => ({}))) as { error?: { code?: string; message?: string; errorId?: string; fields?: { expected?: string[]; replayed?: string[] } } };
  const code = body.error?.code ?? "";
  const message = body.error?.message;
  if (res.status === 401) return { ok: false, kind: "unauthorized", message };
  if (res.status === 410) return { ok: false, kind: "outdated", message };
  if (code === "conflict:member") return { ok: false, kind: "other-member", message };
  if (code === "conflict:mutation_gap") return { ok: false, kind: "gap", expected: Number(body.error?.fields?.expected?.[0]), message };
  if (code === "conflict:client_reused") return { ok: false, kind: "reused", replayed: (body.error?.fields?.replayed ?? []).map(Number), message };
  if (res.status === 500) return { ok: false, kind: "retry", message, errorId: body.error?.errorId ?? "" };
  if (res.status === 429 || res.status >= 500) return { ok: false, kind: "retry", message, retryAfterS: Number(res.headers.get("retry-after")) || undefined };
  return { ok: false, kind: "refused", message };
}

export function sendPush(body: { clientId: string; asMember: string; mutations: { id: number; name: string; args: unknown }[] }) {
  return call<PushResponse>("/api/sync/push", {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ protocolVersion: PROTOCOL_VERSION, ...body }),
  });
}

export function fetchPull(clientId: string, cursor: number, limit = 500) {
  return call<PullResponse>(`/api/sync/pull?protocolVersion=${PROTOCOL_VERSION}&clientId=${clientId}&cursor=${cursor}&limit=${limit}`);
}

export function uploadPhoto(id: string, blob: Blob, sha256: string) {
  return call<{ stored: boolean; sha256: string }>(`/api/photos/${id}`, { method: "PUT", headers: { "content-type": "image/jpeg", "x-content-sha256": sha256 }, body: blob });
}
