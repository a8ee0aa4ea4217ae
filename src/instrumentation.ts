// Runs once when the server starts: settings are checked before the first request.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { serverEnv, siteOrigin, MISSING_ORIGIN_MESSAGE } = await import("./server/env");
  // Throws with every invalid setting named: the server does not start on bad settings.
  const env = serverEnv();
  if (!siteOrigin(env)) console.warn(`Lodebook: ${MISSING_ORIGIN_MESSAGE}`);
  if (env.NODE_ENV === "production" && !(globalThis as { __lodebookFrontDoor?: boolean }).__lodebookFrontDoor) {
    console.warn(
      "Lodebook: started without its front door (scripts/serve.mjs, `npm start`): callers' addresses are unknown, so per-address limits treat everyone as one caller.",
    );
  }
}
