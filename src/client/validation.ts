import { z } from "zod";
import { answerSchema } from "@/lib/entities/answer";
import { barrenRockSchema } from "@/lib/entities/barren-rock";
import { findSchema } from "@/lib/entities/find";
import { outingSchema } from "@/lib/entities/outing";
import { scaleSchema } from "@/lib/entities/scale";
import { weighInSchema } from "@/lib/entities/weigh-in";
import { MUTATION_ARGS, type MutationName } from "@/lib/sync/mutations";
import { LocalValidationError } from "./local-validation-error";

// The shared zod schemas as the device uses them before it saves. Loaded on demand by
// ./logbook (a chunk the service worker precaches), so screens that only read open without it.

function check<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  const parsed = schema.safeParse(value);
  if (!parsed.success) {
    const fields: Record<string, string[]> = {};
    for (const issue of parsed.error.issues) (fields[issue.path.join(".") || "_"] ??= []).push(issue.message);
    throw new LocalValidationError(fields);
  }
  return parsed.data;
}

const RECORDS = { outing: outingSchema, find: findSchema, weighIn: weighInSchema, scale: scaleSchema, barrenRock: barrenRockSchema, answer: answerSchema };

export function checkRecord<K extends keyof typeof RECORDS>(kind: K, value: unknown): z.infer<(typeof RECORDS)[K]> {
  return check(RECORDS[kind], value) as z.infer<(typeof RECORDS)[K]>;
}

export function checkArgs(name: MutationName, args: unknown): unknown {
  return check(MUTATION_ARGS[name], args);
}
