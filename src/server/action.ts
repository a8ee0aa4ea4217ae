import "server-only";
import { z } from "zod";
import { can, type Capability } from "@/lib/roles";
import { type Actor } from "./auth/actor";
import { currentActor } from "./auth/current";
import { fieldErrorsOf } from "./http";
import { logger } from "./log";

export type ActionState = { ok?: boolean; message?: string; fields?: Record<string, string[]> };

type Access = { public: true } | { capability: Capability | "session" };

/**
 * Every server action is made here: it parses the form with zod, then checks the session
 * and the capability itself (server actions are public endpoints), then acts.
 */
export function defineAction<S extends z.ZodType>(access: Access, schema: S, act: (input: z.infer<S>, actor: Actor | null) => Promise<ActionState | void>) {
  return async (_prev: ActionState, formData: FormData): Promise<ActionState> => {
    // An action is a public endpoint: a hand-made call can send any value in place of the form.
    if (!(formData instanceof FormData)) return { ok: false, message: "Send the form's fields.", fields: { _: ["not a form"] } };
    const parsed = schema.safeParse(Object.fromEntries(formData));
    if (!parsed.success) return { ok: false, message: "Check the marked fields.", fields: fieldErrorsOf(parsed.error) };
    let actor: Actor | null = null;
    if (!("public" in access)) {
      actor = await currentActor();
      if (!actor) return { ok: false, message: "Your session has ended. Sign in again." };
      if (access.capability !== "session" && !can(actor.role, access.capability)) {
        logger.warn({ code: "forbidden:action", actor: actor.id }, "refused");
        return { ok: false, message: "Your role does not allow this." };
      }
    }
    return (await act(parsed.data, actor)) ?? { ok: true };
  };
}
