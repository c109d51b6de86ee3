import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  { ignores: [".next/**", ".next-*/**", ".data/**", "drizzle/**", "node_modules/**", "docs/**"] },
  {
    // Only the data-access layer (lib/dal) and db/ itself reach the database. Type-only imports
    // (row and JSON-column types) are allowed; @/db/vocabulary (the as-const arrays, no imports)
    // is for every layer. Tests and scripts are exempt: tests check rows directly, scripts
    // migrate, seed and measure.
    files: ["**/*.{ts,tsx,mts,cts}"],
    ignores: ["lib/dal/**", "db/**", "tests/**", "scripts/**", "drizzle.config.ts"],
    rules: {
      "@typescript-eslint/no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["@/db/*", "!@/db/vocabulary", "**/db/client", "**/db/schema", "**/db/schema/*", "**/db/migrate", "**/db/seed/*"],
              allowTypeImports: true,
              message: "Only lib/dal (and db/) import the database: call a lib/dal function instead (see DEVELOPERS.md).",
            },
          ],
        },
      ],
    },
  },
  {
    // The orbit engine is pure: it must run unchanged in the browser and on the server.
    files: ["lib/orbit/**/*.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["next", "next/*", "react", "react-dom", "@/db/*", "@/storage/*", "@/lib/dal/*", "node:*", "pg", "minio"],
              message: "lib/orbit stays free of framework, database, storage and Node imports.",
            },
          ],
        },
      ],
    },
  },
];

export default config;
