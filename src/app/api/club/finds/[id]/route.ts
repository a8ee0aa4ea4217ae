import { z } from "zod";
import { requireActor } from "@/server/auth/actor";
import { findForOfficer } from "@/server/club/finds";
import { AppError } from "@/server/errors";
import { json, route } from "@/server/http";

type Ctx = { params: Promise<{ id: string }> };

/** A find as an officer opens it from the ledger. */
export const GET = route<Ctx>(async (req, ctx) => {
  const id = z.uuid().safeParse((await ctx.params).id);
  await requireActor(req, "viewLedger", "club");
  if (!id.success) throw new AppError("not_found:find", "No such find.");
  return json(findForOfficer(id.data));
});
