import type { PullResponse, PushResponse } from "@/lib/sync/protocol";
import { PROTOCOL_VERSION } from "@/lib/sync/version";

export type Answer<T> =
  | { ok: true; body: T }
  | {
      ok: false;
      kind: "offline" | "unauthorized" | "other-member" | "outdated" | "gap" | "reused" | "retry" | "refused" | "offset";
      /** For "gap": the mutation id the server expects; for "offset": the bytes it holds of the photo. */
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
  const body = (await res.json().catch(() => ({}))) as {
    error?: { code?: string; message?: string; errorId?: string; fields?: { expected?: string[]; replayed?: string[]; offset?: string[] } };
  };
  const code = body.error?.code ?? "";
  const message = body.error?.message;
  if (res.status === 401) return { ok: false, kind: "unauthorized", message };
  if (res.status === 410) return { ok: false, kind: "outdated", message };
  if (code === "conflict:member") return { ok: false, kind: "other-member", message };
  if (code === "conflict:mutation_gap") return { ok: false, kind: "gap", expected: Number(body.error?.fields?.expected?.[0]), message };
  if (code === "conflict:client_reused") return { ok: false, kind: "reused", replayed: (body.error?.fields?.replayed ?? []).map(Number), message };
  if (code === "conflict:offset") return { ok: false, kind: "offset", expected: Number(body.error?.fields?.offset?.[0]), message };
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

/** Where a photo's upload stands on the server: bytes held of its total. */
export type UploadState = { received: number; total: number; complete: boolean };

export function photoUploadStatus(id: string) {
  return call<UploadState>(`/api/photos/${id}/upload`);
}

/** One chunk of a photo at the offset the server holds; the last one stores it. */
export function sendPhotoChunk(id: string, offset: number, chunk: Blob) {
  return call<UploadState>(`/api/photos/${id}/upload?offset=${offset}`, {
    method: "PUT",
    headers: { "content-type": "application/octet-stream" },
    body: chunk,
  });
}
