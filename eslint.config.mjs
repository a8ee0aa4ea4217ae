import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["warn", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", destructuredArrayIgnorePattern: "^_" }],
    },
  },
  { ignores: [".next/**", "public/sw.js", "public/swe-worker*", "public/maplibre-gl-worker.mjs", "data/**", "drizzle/**", "next-env.d.ts", "test-results/**", "bench/tmp/**"] },
];
export default config;
