import withSerwistInit from "@serwist/next";
import fs from "node:fs";
import path from "node:path";
import { CompileHintsPlugin } from "./scripts/lib/compile-hints.mjs";
import { ACTION_BODY_LIMIT } from "./scripts/lib/front-door.mjs";

// MapLibre runs its tile work in a Web Worker loaded by URL: serve the package's own worker
// file from public/ (git-ignored, copied here on every build and start).
const mapWorker = "node_modules/maplibre-gl/dist/maplibre-gl-worker.mjs";
if (fs.existsSync(mapWorker)) fs.copyFileSync(mapWorker, "public/maplibre-gl-worker.mjs");

const revision = process.env.LODEBOOK_BUILD_ID ?? String(Date.now());

const withSerwist = withSerwistInit({
  swSrc: "sw/sw.ts",
  swDest: "public/sw.js",
  // The worker is only useful against a production build; in `next dev` it would cache stale chunks.
  disable: process.env.NODE_ENV === "development",
  // Camp sync reacts to "online" itself; a reload then would interrupt a member mid-entry.
  reloadOnOnline: false,
  // Registered by the app once a page has settled (src/client/service-worker.ts): the first
  // install's precache would otherwise compete with a phone's first screen for its cores.
  register: false,
  // Every member screen opens with no signal after one visit: precache their shells.
  additionalPrecacheEntries: [
    ...[
      "/",
      "/finds",
      "/finds/new",
      "/finds/view",
      "/outings",
      "/outings/view",
      "/map",
      "/sync",
      "/settings",
      "/scales",
      "/barren-rock",
      "/weigh",
      "/offline",
      "/manifest.webmanifest",
    ].map((url) => ({ url, revision })),
    ...["/maplibre-gl-worker.mjs", "/icons/icon-192.png", "/icons/icon-512.png"].map((url) => ({ url, revision })),
  ],
});

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // Server actions here are short forms (sign-in, joining); Next counts the body as it
  // streams and refuses it past this size, before any action runs.
  experimental: { serverActions: { bodySizeLimit: ACTION_BODY_LIMIT } },
  serverExternalPackages: ["better-sqlite3", "smtp-server", "mailparser", "pino"],
  webpack(config, { isServer, dev, webpack }) {
    // The member layout and each screen are separate entries that always load together. Small
    // modules both use (device database, logbook, sync start, roles) fell under Next's 20 kB
    // threshold for a shared chunk and were copied into both, so a screen loaded them twice.
    // They get one chunk of their own; everything else keeps Next's splitting (a lower
    // threshold for all made many tiny chunks, each paying its own gzip and request).
    if (!isServer && !dev && config.optimization.splitChunks) {
      config.optimization.splitChunks.cacheGroups.fieldShared = {
        name: "field-shared",
        chunks: "initial",
        minChunks: 2,
        minSize: 0,
        priority: 25,
        test: /[\\/]src[\\/](client[\\/](device-db|member|logbook|local-validation-error|live-query|sync[\\/](scheduler|status))\.|lib[\\/]roles|components[\\/]field[\\/](skeleton|member-gate))|[\\/]node_modules[\\/](uuid|dexie-react-hooks)[\\/]/,
        reuseExistingChunk: true,
        enforce: true,
      };
      // The link every screen and frame uses (the shell's header and tab bar, the screens, the
      // open pages' header): one copy in a chunk of its own, not one in each of them.
      config.optimization.splitChunks.cacheGroups.intentLink = {
        name: "intent-link",
        chunks: "initial",
        minChunks: 2,
        minSize: 0,
        priority: 24,
        test: /[\\/]src[\\/]components[\\/]intent-link\./,
        enforce: true,
      };
      // Every file a page runs at start is compiled off the main thread as it streams in.
      config.plugins.push(new CompileHintsPlugin(webpack));
    }
    // Dexie's package points bundlers at its ES5 build; its modern ES build is the same code,
    // 1.4 kB smaller gzipped, on every member screen. One alias, so one Dexie instance.
    if (!isServer) config.resolve.alias = { ...config.resolve.alias, dexie$: path.resolve("node_modules/dexie/dist/modern/dexie.mjs") };
    return config;
  },
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "X-Frame-Options", value: "DENY" },
        ],
      },
    ];
  },
};

export default withSerwist(nextConfig);
