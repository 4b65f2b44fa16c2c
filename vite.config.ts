import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { fileURLToPath } from "node:url";
import { defineConfig, type Plugin } from "vite";

/**
 * The template render worker (decision 007) as its own file in the server build, next to
 * index.js: build/server/template-worker.js. Modules it shares with the server bundle go to a
 * shared chunk. Not used by the dev server; there renders stay on the main thread.
 */
function templateWorker(): Plugin {
  return {
    name: "hiltbench:template-worker",
    apply: "build",
    applyToEnvironment: (environment) => environment.name === "ssr",
    buildStart() {
      this.emitFile({ type: "chunk", id: fileURLToPath(new URL("./app/lib/rendering/worker.server.ts", import.meta.url)), fileName: "template-worker.js" });
    },
  };
}

export default defineConfig({
  plugins: [tailwindcss(), reactRouter(), templateWorker()],
  resolve: { tsconfigPaths: true },
});
