import "server-only";
import { randomUUID } from "node:crypto";
import { NextResponse } from "next/server";
import { z } from "zod";
import { shownKey, unknownFieldsText } from "@/lib/text/controls";
import { AppError, type FieldErrors } from "./errors";
import { logger } from "./log";

/** How many of a body's problems an answer lists: enough to mend a form, never megabytes. */
export const MAX_LISTED_PROBLEMS = 20;
function issueMessage(issue: z.core.$ZodIssue): string {
  // zod's own words list every unknown key, so a body of 60 000 of them came back whole.
  if (issue.code === "unrecognized_keys" && issue.message.startsWith("Unrecognized key")) return `${unknownFieldsText(issue.keys)}.`;
  return issue.message;
}

export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  const issues = error.issues.slice(0, MAX_LISTED_PROBLEMS);
  for (const issue of issues) {
    const key = issue.path.map((p) => shownKey(String(p))).join(".") || "_";
    (fields[key] ??= []).push(issueMessage(issue));
  }
  const more = error.issues.length - issues.length;
  if (more > 0) (fields._ ??= []).push(`And ${more} more ${more === 1 ? "problem" : "problems"} like these.`);
  return fields;
}

export function badRequest(subject: string, error: z.ZodError): AppError {
  const fields = fieldErrorsOf(error);
  const named = Object.keys(fields).filter((k) => k !== "_");
  const message = named.length > 0 ? `Check ${named.join(", ")}: ${fields[named[0]][0]}` : (fields._?.[0] ?? "The request is not valid.");
  return new AppError(`bad_request:${subject}`, message, fields);
}

export const MAX_JSON_BYTES = 1_000_000;

/**
 * How deep a request's JSON may nest. Nothing the app sends goes past a dozen levels (a claim's
 * boundary in a sync change is the deepest); thousands of levels pass the byte limit, and then
 * code that walks the value (a digest, a comparison, a geometry check) runs out of stack.
 */
export const MAX_JSON_DEPTH = 64;

/**
 * Where `text` (JSON) first nests deeper than `max` arrays and objects, as the path of keys and
 * indexes to it ("mutations.0.args.id"), or null. One pass over the text, no recursion, before
 * it is parsed: a hostile body cannot exhaust the stack here either. Each key in the path is cut
 * to 40 characters and loses its control and direction characters (it goes into the message).
 */
export function jsonTooDeep(text: string, max = MAX_JSON_DEPTH): string | null {
  // Each open array or object, with the index or key being read in it.
  const open: { array: boolean; at: string | number }[] = [];
  let stringStart = -1;
  let lastString = [0, 0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (stringStart >= 0) {
      if (c === 0x5c)
        i++; // a backslash: the next character is escaped
      else if (c === 0x22) {
        lastString = [stringStart, i];
        stringStart = -1;
      }
      continue;
    }
    if (c === 0x22) stringStart = i + 1;
    else if (c === 0x3a && open.length > 0) open[open.length - 1].at = text.slice(lastString[0], lastString[1]);
    else if (c === 0x2c && open.at(-1)?.array) (open[open.length - 1].at as number)++;
    else if (c === 0x5b || c === 0x7b) {
      if (open.length >= max) return open.map((o) => shownKey(o.at)).join(".") || "_";
      open.push({ array: c === 0x5b, at: c === 0x5b ? 0 : "" });
    } else if (c === 0x5d || c === 0x7d) open.pop();
  }
  return null;
}

/**
 * A request's body, refused as soon as it passes `maxBytes`: a declared length over the limit
 * is refused before a byte is read, and a chunked body (no declared length) is counted while
 * it streams, so memory never holds more than the limit.
 */
export async function readBodyLimited(req: Request, maxBytes: number, subject: string, message = `The body is over ${maxBytes} bytes.`): Promise<Buffer> {
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > maxBytes) throw new AppError(`too_large:${subject}`, message);
  if (!req.body) return Buffer.alloc(0);
  const chunks: Uint8Array[] = [];
  let size = 0;
  const reader = req.body.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw new AppError(`too_large:${subject}`, message);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks, size);
}

/** Reads a JSON body (refusing other content types and oversize bodies) and parses it with zod. */
export async function parseJsonBody<T extends z.ZodType>(req: Request, schema: T, subject: string, maxBytes = MAX_JSON_BYTES): Promise<z.infer<T>> {
  const type = req.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("application/json")) {
    throw new AppError(`unsupported:${subject}`, "Send the body as application/json.");
  }
  const bytes = await readBodyLimited(req, maxBytes, subject);
  const notJson = () => new AppError(`bad_request:${subject}`, "The body is not valid JSON.", { _: ["not valid JSON"] });
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw notJson();
  }
  const deep = jsonTooDeep(text);
  if (deep !== null) {
    const message = `nested more than ${MAX_JSON_DEPTH} levels deep`;
    throw new AppError(`bad_request:${subject}`, `Check ${deep}: ${message}.`, { [deep]: [message] });
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw notJson();
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw badRequest(subject, parsed.error);
  return parsed.data;
}

export function parseSearchParams<T extends z.ZodType>(req: Request, schema: T, subject: string): z.infer<T> {
  const params = Object.fromEntries(new URL(req.url).searchParams);
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw badRequest(subject, parsed.error);
  return parsed.data;
}

type Handler<C> = (req: Request, ctx: C) => Promise<Response> | Response;

/**
 * Whether the caller hung up part-way through sending its body: Node fails the read with
 * "aborted" (ECONNRESET). Nothing went wrong on the server, and nobody is left to read an answer.
 */
export function callerHungUp(req: Request, error: unknown): boolean {
  if (req.signal?.aborted) return true;
  if (typeof error !== "object" || error === null) return false;
  const { code, message } = error as { code?: unknown; message?: unknown };
  return code === "ECONNRESET" && message === "aborted";
}

/** Every route handler goes through here: AppErrors become their status, anything else a logged 500. */
export function route<C = unknown>(handler: Handler<C>): Handler<C> {
  return async (req, ctx) => {
    try {
      return await handler(req, ctx);
    } catch (error) {
      if (error instanceof AppError) {
        if (error.status >= 401) logger.warn({ code: error.code, method: req.method, path: new URL(req.url).pathname }, "refused");
        const retryAfter = error.fields?.retryAfter?.[0];
        return NextResponse.json(error.toJSON(), {
          status: error.status,
          headers: { "Cache-Control": "no-store", ...(retryAfter ? { "Retry-After": retryAfter } : {}) },
        });
      }
      if (callerHungUp(req, error)) {
        logger.info({ method: req.method, path: new URL(req.url).pathname }, "caller hung up while sending");
        return NextResponse.json(
          { error: { code: "bad_request:incomplete", message: "The request ended before its body did; send it again." } },
          { status: 400, headers: { "Cache-Control": "no-store" } },
        );
      }
      // The id goes to the caller and to the log line, so an officer can find the failure a
      // member reports ("send to the club") without the answer carrying any of its detail.
      const errorId = randomUUID();
      logger.error(
        {
          errorId,
          err: error instanceof Error ? { name: error.name, message: error.message, stack: error.stack } : String(error),
          path: new URL(req.url).pathname,
        },
        "handler failed",
      );
      return NextResponse.json(
        { error: { code: "server_error", message: "Something went wrong on the server. Nothing you sent was lost; try again.", errorId } },
        { status: 500 },
      );
    }
  };
}

export function json(data: unknown, init?: ResponseInit): Response {
  return NextResponse.json(data, { ...init, headers: { "Cache-Control": "no-store", ...init?.headers } });
}

/**
 * A route's [id] as a UUID. A malformed id answers exactly as an unknown one does (404 with the
 * subject's message), so ids cannot be probed by their shape.
 */
export async function routeId(ctx: { params: Promise<{ id: string }> }, subject: string, message: string): Promise<string> {
  const parsed = z.uuid().safeParse((await ctx.params).id);
  if (!parsed.success) throw new AppError(`not_found:${subject}`, message);
  return parsed.data;
}
