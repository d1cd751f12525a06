import { defineConfig } from "vitest/config";
import react from "@vitejs/plugin-react";
import { fileURLToPath } from "node:url";

const alias = {
  "@shared": fileURLToPath(new URL("./shared", import.meta.url)),
  "@": fileURLToPath(new URL("./src", import.meta.url)),
};

// Three projects: pure domain code, the API against a real PostgreSQL, and client components.
export default defineConfig({
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: "shared", environment: "node", include: ["tests/shared/**/*.test.ts"] },
      },
      {
        resolve: { alias },
        test: {
          name: "server",
          environment: "node",
          // The start command's supervisor tests run real processes beside the API tests.
          include: ["tests/server/**/*.test.ts", "tests/scripts/**/*.test.ts"],
          setupFiles: ["tests/setup/server.ts"],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        plugins: [react()],
        resolve: { alias },
        test: {
          name: "client",
          environment: "happy-dom",
          include: ["tests/client/**/*.test.tsx"],
          setupFiles: ["tests/setup/client.ts"],
        },
      },
      {
        resolve: { alias },
        test: {
          name: "e2e",
          environment: "node",
          include: ["tests/e2e/**/*.test.ts"],
          // Browser journeys run against their own database seeded with the demo neighbourhood.
          env: process.env.E2E_DATABASE_URL ? { DATABASE_URL: process.env.E2E_DATABASE_URL } : {},
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
