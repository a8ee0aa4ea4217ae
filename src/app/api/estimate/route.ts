import { estimateSpecimen, EstimateInputError } from "@/lib/estimate";
import { specimenInputSchema } from "@/lib/entities/specimen-input";
import { AppError } from "@/server/errors";
import { json, parseJsonBody, route } from "@/server/http";

/** The specimen estimate, computed by the same module the browser runs. No session needed. */
export const POST = route(async (req) => {
  const input = await parseJsonBody(req, specimenInputSchema, "estimate", 20_000);
  try {
    return json({ estimate: estimateSpecimen(input) });
  } catch (error) {
    if (error instanceof EstimateInputError) {
      throw new AppError("bad_request:estimate", error.message, { [error.field]: [error.message] });
    }
    throw error;
  }
});
