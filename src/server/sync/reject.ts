import "server-only";

/** A change refused for good: reported back to the device, and the queue moves past it. */
export class RejectError extends Error {
  constructor(
    readonly reason: string,
    message: string,
    readonly field?: string,
    /** A version to keep in history although the change itself is refused. */
    readonly keep?: { entity: string; entityId: string; memberId: string; version: Record<string, unknown> },
  ) {
    super(message);
    this.name = "RejectError";
  }
}
