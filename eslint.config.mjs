import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  { ignores: [".next/**", ".next-*/**", ".data/**", "drizzle/**", "node_modules/**", "docs/**"] },
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
