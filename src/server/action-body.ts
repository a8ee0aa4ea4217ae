import "server-only";
import { Readable } from "node:stream";
import busboy from "next/dist/compiled/busboy";
import { shownKey } from "@/lib/text/controls";
import { AppError } from "./errors";

// A server action's arguments come in React's reply encoding: JSON in which a string starting
// with "$" refers to another part of the body (a form, a map, a file, a stream, a promise...).
// React decodes a body it cannot read by throwing, and Next answers that with a 500. Every
// Lodebook action takes (previous state, form), so a call may hold plain values and form
// references only; anything else is refused here, before Next decodes it, with a 400 that
// says which part is wrong. A call that passes still meets the action's own checks. The body is
// read exactly as Next's action handler reads it (its content type as written, the text's bytes
// as they came, a form through Next's own multipart reader), or the two could see different
// arguments in one body.

/** Strings React writes for plain values: an escaped "$…", undefined and the odd numbers. */
const PLAIN_MARK = /^\$(?:\$|undefined$|NaN$|Infinity$|-Infinity$|-0$)/;
/** A reference to the form sent alongside ("$K" and the form's number in hexadecimal). */
const FORM_REFERENCE = /^\$K[0-9a-f]{1,8}$/;
/** Deeper than any state an action returns; deeper still is refused rather than walked. */
const MAX_DEPTH = 16;

function isPlain(value: unknown, depth: number): boolean {
  if (typeof value === "string") return !value.startsWith("$") || PLAIN_MARK.test(value);
  if (value === null || typeof value !== "object") return true;
  if (depth >= MAX_DEPTH) return false;
  return Object.values(value).every((v) => isPlain(v, depth + 1));
}

function parsed(text: string, part: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError("bad_request:action_body", `The action's ${part} could not be read: it is not JSON.`);
  }
}

/** The arguments of a call made from script: a list of plain values and form references. */
function checkActionArguments(text: string, part = "arguments"): void {
  const args = parsed(text, part);
  if (!Array.isArray(args)) throw new AppError("bad_request:action_body", `The action's ${part} must be a list.`);
  const fine = args.every((a) => (typeof a === "string" && FORM_REFERENCE.test(a)) || isPlain(a, 0));
  if (!fine) throw new AppError("bad_request:action_body", `The action's ${part} may hold plain values and the form only.`);
}

const BOUND = /^\$@([0-9a-f]{1,8})$/;

/**
 * A form posted without script names its action in its fields: "$ACTION_ID_<id>" (no JSON), or
 * "$ACTION_REF_<name>" with the action's reference in "$ACTION_<name>:0" and the arguments bound
 * to it in the part that reference names. React reads them for any name; Next has read the form
 * with Request.formData(), as this does.
 */
function checkFormWithoutScript(form: FormData): void {
  const text = (key: string): string | undefined => {
    const value = form.get(key);
    if (value === null) return undefined;
    if (typeof value !== "string") throw new AppError("bad_request:action_body", `The form's field "${shownKey(key)}" must be text.`);
    return value;
  };
  for (const key of new Set(form.keys())) {
    if (!key.startsWith("$ACTION_REF_")) continue;
    const prefix = `$ACTION_${key.slice("$ACTION_REF_".length)}:`;
    const headKey = `${prefix}0`;
    const head = text(headKey);
    if (head === undefined) throw new AppError("bad_request:action_body", `The form's field "${shownKey(headKey)}" (the action's reference) is missing.`);
    const meta = parsed(head, `field "${shownKey(headKey)}" (the action's reference)`);
    if (meta === null || typeof meta !== "object" || Array.isArray(meta))
      throw new AppError("bad_request:action_body", `The form's field "${shownKey(headKey)}" (the action's reference) must be an object.`);
    const { bound, ...rest } = meta as { bound?: unknown };
    if (!isPlain(rest, 0)) throw new AppError("bad_request:action_body", `The form's field "${shownKey(headKey)}" may hold plain values only.`);
    if (bound === undefined || bound === null) continue;
    const at = typeof bound === "string" ? BOUND.exec(bound) : null;
    if (!at) throw new AppError("bad_request:action_body", `The form's field "${shownKey(headKey)}" names its bound arguments wrongly.`);
    const name = `${prefix}${parseInt(at[1], 16)}`;
    const args = text(name);
    if (args === undefined) throw new AppError("bad_request:action_body", `The form's field "${shownKey(name)}" (the bound arguments) is missing.`);
    checkActionArguments(args, `field "${shownKey(name)}"`);
  }
}

const unreadableForm = () => new AppError("bad_request:action_body", "The form could not be read: its body is not a whole form of its declared type.");

async function formOf(request: Request): Promise<FormData> {
  try {
    return await request.clone().formData();
  } catch {
    throw unreadableForm();
  }
}

/**
 * A script's form as Next's action handler reads it: through Next's own busboy, each part in the
 * character set it declares, the first of a repeated header or field. A file is null.
 */
async function fieldsAsNextReads(request: Request, type: string): Promise<Map<string, string | null>> {
  const fields = new Map<string, string | null>();
  let reader: ReturnType<typeof busboy>;
  try {
    reader = busboy({ defParamCharset: "utf8", headers: { "content-type": type } });
  } catch {
    throw unreadableForm();
  }
  // A part busboy finds no name for (one named only by "name*=") comes with none: React's reader
  // throws on it.
  let nameless = false;
  await new Promise<void>((resolve, reject) => {
    reader.on("field", (name, value) => {
      if (typeof name !== "string") nameless = true;
      else if (!fields.has(name)) fields.set(name, value);
    });
    reader.on("file", (name, stream) => {
      stream.resume();
      if (typeof name !== "string") nameless = true;
      else if (!fields.has(name)) fields.set(name, null);
    });
    reader.on("error", () => reject(unreadableForm()));
    reader.on("close", () => resolve());
    const body = request.clone().body;
    if (!body) reader.end();
    else Readable.fromWeb(body as import("node:stream/web").ReadableStream).pipe(reader);
  });
  if (nameless) throw new AppError("bad_request:action_body", 'Each part of the form needs its name (Content-Disposition: form-data; name="…").');
  return fields;
}

/**
 * Refuses a possible server action whose body React could not decode. `request` is a POST that
 * Next may take as an action: one naming an action in its header, or a form post.
 */
export async function checkActionBody(request: Request): Promise<void> {
  // As Next tells them apart: the type as written (an upper-case "Multipart/…" is not a form to
  // it, and its body is read as text).
  const type = request.headers.get("content-type") ?? "";
  const multipart = type.startsWith("multipart/form-data");
  if (request.headers.has("next-action")) {
    if (multipart) {
      const root = (await fieldsAsNextReads(request, type)).get("0");
      if (typeof root !== "string") throw new AppError("bad_request:action_body", 'The form has no arguments field ("0").');
      checkActionArguments(root, 'field "0" (the arguments)');
      return;
    }
    // Next does not decode such a body (it answers that no such action takes one).
    if (type === "application/x-www-form-urlencoded") return;
    // The bytes as Next reads them: a byte-order mark stays, a bad byte becomes U+FFFD.
    checkActionArguments(Buffer.from(await request.clone().arrayBuffer()).toString("utf-8"));
    return;
  }
  if (multipart) checkFormWithoutScript(await formOf(request));
}
