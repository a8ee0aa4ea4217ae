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
  // Layer boundaries (STYLE.md, DEVELOPERS.md): the pure library imports no framework, device
  // or server code; device code and components reach the server only through server actions.
  {
    files: ["src/lib/**/*.{ts,tsx}"],
    rules: {
      "@typescript-eslint/no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["react", "react-dom", "react/*", "next", "next/*", "dexie", "dexie-react-hooks", "better-sqlite3", "drizzle-orm", "drizzle-orm/*"],
              message: "src/lib is pure: no framework, device or database imports.",
            },
            {
              group: ["@/server/*", "@/client/*", "@/components/*", "@/app/*", "../server/*", "../../server/*", "../client/*"],
              message: "src/lib is pure: it imports only src/lib and plain packages.",
            },
          ],
        },
      ],
    },
  },
  {
    files: ["src/client/**/*.{ts,tsx}", "src/components/**/*.{ts,tsx}"],
    rules: {
      "@typescript-eslint/no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["@/server/*", "!@/server/actions", "!@/server/actions/*"],
              allowTypeImports: true,
              message: "Device code and components reach the server through server actions (src/server/actions) or its HTTP API, never its modules.",
            },
            { group: ["better-sqlite3", "drizzle-orm", "drizzle-orm/*"], message: "The database is the server's alone." },
          ],
        },
      ],
    },
  },
  {
    ignores: [
      ".next/**",
      "public/sw.js",
      "public/swe-worker*",
      "public/maplibre-gl-worker.mjs",
      "data/**",
      "drizzle/**",
      "next-env.d.ts",
      "test-results/**",
      "bench/tmp/**",
    ],
  },
];
export default config;
