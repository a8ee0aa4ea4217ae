import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  { ignores: [".next/**", "public/sw.js", "public/swe-worker*", "data/**", "drizzle/**", "next-env.d.ts", "test-results/**"] },
];
export default config;
