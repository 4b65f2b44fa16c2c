import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

// Unit tests sit beside the code (app/**); Postgres-backed tests live in tests/integration.
export default defineConfig({
  resolve: { alias: { "~": fileURLToPath(new URL("./app", import.meta.url)) } },
  test: {
    include: ["app/**/*.test.ts", "tests/integration/**/*.test.ts", "scripts/**/*.test.ts"],
    environment: "node",
    server: { deps: { inline: ["kysely"] } },
    setupFiles: ["./tests/setup/console.ts"],
    testTimeout: 20000,
    hookTimeout: 60000,
    fileParallelism: true,
  },
});
