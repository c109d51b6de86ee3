import { defineConfig } from "vitest/config";
import path from "node:path";
import { fileURLToPath } from "node:url";

const __dirname = path.dirname(fileURLToPath(import.meta.url));

const alias = {
  "@": path.resolve(__dirname),
  // Next's guard module throws outside a server bundle; in tests the code runs on the server.
  "server-only": path.resolve(__dirname, "tests/support/server-only.ts"),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: "unit",
          // Generous: property tests do real work and the machine is shared; speed lives in `npm run bench`.
          testTimeout: 60_000,
          include: ["lib/**/*.test.ts", "components/**/*.test.ts", "db/**/*.test.ts", "storage/**/*.test.ts", "scripts/**/*.test.ts"],
          environment: "node",
        },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          // Projects run one after another: the outbox fault tests stop the shared mail
          // catcher, which must never overlap a browser test waiting for a letter.
          sequence: { groupOrder: 1 },
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/support/global-setup.ts"],
          testTimeout: 60_000,
          hookTimeout: 300_000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "e2e",
          sequence: { groupOrder: 2 },
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/support/global-setup.ts"],
          testTimeout: 180_000,
          hookTimeout: 600_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
