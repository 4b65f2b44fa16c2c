import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // Middleware (root.tsx) guards every request once, before any loader or action (decision 011).
  future: { v8_middleware: true },
  buildDirectory: process.env.HB_BUILD_DIR ?? "build",
} satisfies Config;
