import { AppError } from "@/server/errors";
import { route } from "@/server/http";

// An address under /api/ that no handler answers: a 404 in the API's own JSON, for every
// method, where Next would send its HTML page (a client of the API reads neither the page nor
// its status line). Every real handler's address is more specific and wins.
const nothingHere = route(() => {
  throw new AppError("not_found:address", "Nothing answers at this address.");
});

export const GET = nothingHere;
export const POST = nothingHere;
export const PUT = nothingHere;
export const PATCH = nothingHere;
export const DELETE = nothingHere;
