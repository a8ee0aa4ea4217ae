/** A change refused on the device itself, with the field at fault. */
export class LocalValidationError extends Error {
  constructor(readonly fields: Record<string, string[]>) {
    super(Object.values(fields)[0]?.[0] ?? "Check the form.");
    this.name = "LocalValidationError";
  }
}
