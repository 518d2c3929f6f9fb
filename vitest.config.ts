import path from "node:path";
import { defineConfig } from "vitest/config";

const alias = { "@": import.meta.dirname, "server-only": path.join(import.meta.dirname, "tests/support/server-only-stub.ts") };

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/support/global-setup.ts"],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        // npm run test:cluster only (scripts/test-cluster.sh starts the Galera cluster and two app instances).
        resolve: { alias },
        test: { name: "cluster", include: ["tests/cluster/**/*.test.ts"], environment: "node", fileParallelism: false, testTimeout: 120_000, hookTimeout: 120_000 },
      },
    ],
  },
});
