// The protocol's version and limits, without its zod schemas (the device's shell sends them
// without carrying the validator).

/** Bumped when a change to push or pull would confuse an older client. */
export const PROTOCOL_VERSION = 1;
export const MAX_PUSH_MUTATIONS = 500;
export const MAX_PUSH_BYTES = 2_000_000;
export const DEFAULT_PULL_LIMIT = 500;
