import { defineConfig } from "vitest/config";
import path from "node:path";
import { timeoutScale } from "./tests/integration/test-env";

const alias = {
  "@": import.meta.dirname,
  "server-only": path.join(import.meta.dirname, "tests/support/server-only-stub.ts"),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        // A harness limit, not a speed check: property tests and simulations run long on a loaded 2-core machine.
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node", testTimeout: 30_000 },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/integration/global-setup.ts"],
          setupFiles: ["tests/integration/setup-env.ts"],
          fileParallelism: false,
          // Harness limits; test:cluster scales them (tests/integration/test-env.ts timeoutScale).
          testTimeout: 60_000 * timeoutScale,
          hookTimeout: 120_000 * timeoutScale,
        },
      },
    ],
  },
});
