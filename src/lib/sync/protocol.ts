import { z } from "zod";
import { wholeNumber } from "../web/whole-number";
import { MUTATION_NAMES } from "./mutations";
import { DEFAULT_PULL_LIMIT, MAX_PUSH_MUTATIONS } from "./version";

export { DEFAULT_PULL_LIMIT, MAX_PUSH_BYTES, MAX_PUSH_MUTATIONS, PROTOCOL_VERSION } from "./version";

export const mutationSchema = z
  .object({
    id: z.number().int().positive("Mutation ids start at 1."),
    name: z.enum(MUTATION_NAMES as [string, ...string[]], { error: "Unknown change." }),
    args: z.unknown(),
  })
  .strict();

export const pushRequestSchema = z
  .object({
    protocolVersion: z.number().int(),
    clientId: z.uuid({ error: "The client id must be a UUID." }),
    /** The member the device holds these changes for: a check, never the identity (that is the session's). */
    asMember: z.string().max(64).optional(),
    mutations: z
      .array(mutationSchema)
      .min(1, "Send at least one change.")
      .max(MAX_PUSH_MUTATIONS, `At most ${MAX_PUSH_MUTATIONS} changes in one push.`)
      .refine((list) => list.every((m, i) => i === 0 || m.id > list[i - 1].id), "Mutation ids must increase."),
  })
  .strict();

export type PushRequest = z.infer<typeof pushRequestSchema>;

export type MutationResult = { id: number; status: "applied" | "skipped" | "rejected"; reason?: string; field?: string; message?: string };
export type PushResponse = { lastMutationId: number; results: MutationResult[] };

export const pullQuerySchema = z
  .object({
    protocolVersion: wholeNumber("protocolVersion", 0, 1_000_000),
    clientId: z.uuid({ error: "The client id must be a UUID." }),
    cursor: wholeNumber("cursor", 0, Number.MAX_SAFE_INTEGER).default(0),
    limit: wholeNumber("limit", 1, 2000).default(DEFAULT_PULL_LIMIT),
  })
  .strict();

export type PullEntity = "claim" | "outing" | "find" | "photo" | "weighIn" | "scale" | "barrenRock" | "review" | "answer" | "price" | "settings";

/** One change in a pull page: a record as it stands now, or a tombstone. */
export type PullChange =
  { seq: number; entity: PullEntity; op: "put"; value: Record<string, unknown> } | { seq: number; entity: PullEntity; op: "del"; id: string };

export type PullResponse = {
  changes: PullChange[];
  /** Store this only after the page is applied; the next pull starts after it. */
  cursor: number;
  more: boolean;
  /** The last mutation id of this client the server has applied, read in the same transaction. */
  lastMutationId: number;
  /** True when the device's cursor is beyond what this server has (a restore from backup): start again from 0. */
  reset: boolean;
  /**
   * True when deletions the device may not have seen were purged (it was away longer than they
   * are kept): pull everything again from 0, then drop what the full pull did not bring.
   */
  resync: boolean;
};
