import "server-only";
import { AppError } from "./errors";

// A server action's arguments come in React's reply encoding: JSON in which a string starting
// with "$" refers to another part of the body (a form, a map, a file, a stream, a promise...).
// React decodes a body it cannot read by throwing, and Next answers that with a 500. Every
// Lodebook action takes (previous state, form), so a call may hold plain values and form
// references only; anything else is refused here, before Next decodes it, with a 400 that
// says which part is wrong. A call that passes still meets the action's own checks.

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
export function checkActionArguments(text: string, part = "arguments"): void {
  const args = parsed(text, part);
  if (!Array.isArray(args)) throw new AppError("bad_request:action_body", `The action's ${part} must be a list.`);
  const fine = args.every((a) => (typeof a === "string" && FORM_REFERENCE.test(a)) || isPlain(a, 0));
  if (!fine) throw new AppError("bad_request:action_body", `The action's ${part} may hold plain values and the form only.`);
}

const ACTION_PART = /^\$ACTION_(\d{1,6}):(\d{1,6})$/;
const BOUND = /^\$@([0-9a-f]{1,8})$/;

/**
 * A form posted without script names its action in its fields: "$ACTION_ID_<id>" (no JSON),
 * or "$ACTION_REF_<n>" with the action's reference in "$ACTION_<n>:0" and the arguments bound
 * to it in the part that reference names. Next reads an unreadable reference as an unknown
 * action (a 400 of its own); the bound arguments it would fail on.
 */
function checkFormWithoutScript(form: FormData): void {
  const parts = new Map<string, string>();
  for (const [key, value] of form.entries()) {
    if (ACTION_PART.test(key)) {
      if (typeof value !== "string") throw new AppError("bad_request:action_body", `The form's field "${key}" must be text.`);
      parts.set(key, value);
    }
  }
  for (const key of form.keys()) {
    const ref = /^\$ACTION_REF_(\d{1,6})$/.exec(key);
    if (!ref) continue;
    const head = parts.get(`$ACTION_${ref[1]}:0`);
    if (head === undefined) continue;
    let meta: unknown;
    try {
      meta = JSON.parse(head);
    } catch {
      continue;
    }
    if (meta === null || typeof meta !== "object" || Array.isArray(meta)) continue;
    const { bound, ...rest } = meta as { bound?: unknown };
    if (!isPlain(rest, 0)) throw new AppError("bad_request:action_body", `The form's field "$ACTION_${ref[1]}:0" may hold plain values only.`);
    if (bound === undefined || bound === null) continue;
    const at = typeof bound === "string" ? BOUND.exec(bound) : null;
    if (!at) throw new AppError("bad_request:action_body", `The form's field "$ACTION_${ref[1]}:0" names its bound arguments wrongly.`);
    const name = `$ACTION_${ref[1]}:${parseInt(at[1], 16)}`;
    const text = parts.get(name);
    if (text === undefined) throw new AppError("bad_request:action_body", `The form's field "${name}" (the bound arguments) is missing.`);
    checkActionArguments(text, `field "${name}"`);
  }
}

async function formOf(request: Request): Promise<FormData> {
  try {
    return await request.clone().formData();
  } catch {
    throw new AppError("bad_request:action_body", "The form could not be read: its body is not a whole form of its declared type.");
  }
}

/**
 * Refuses a possible server action whose body React could not decode. `request` is a POST
 * that Next may take as an action: one naming an action in its header, or a form post.
 */
export async function checkActionBody(request: Request): Promise<void> {
  const type = (request.headers.get("content-type") ?? "").toLowerCase();
  const isForm = type.startsWith("multipart/form-data") || type.startsWith("application/x-www-form-urlencoded");
  if (request.headers.has("next-action")) {
    if (type.startsWith("multipart/form-data")) {
      const form = await formOf(request);
      const root = form.get("0");
      if (typeof root !== "string") throw new AppError("bad_request:action_body", 'The form has no arguments field ("0").');
      checkActionArguments(root, 'field "0" (the arguments)');
      return;
    }
    checkActionArguments(await request.clone().text());
    return;
  }
  if (isForm) checkFormWithoutScript(await formOf(request));
}
