import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

// System tests: the built app served by react-router-serve on a PostgreSQL cluster each file
// starts for itself (they restart it, run two servers on it…). `node scripts/test.mjs system`
// builds the app and runs them, one file at a time (the machine has two cores).
export default defineConfig({
  resolve: { alias: { "~": fileURLToPath(new URL("./app", import.meta.url)) } },
  test: {
    include: ["tests/system/**/*.test.ts"],
    environment: "node",
    server: { deps: { inline: ["kysely"] } },
    testTimeout: 180_000,
    hookTimeout: 180_000,
    fileParallelism: false,
  },
});
