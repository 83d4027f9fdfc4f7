import path from "node:path";
import { defineConfig } from "vitest/config";

// The object-store SDK prints a notice about its future Node versions in every worker; this project runs on Node 20.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= "true";

const root = path.resolve(import.meta.dirname, "..");
const alias = { "@": root };

export default defineConfig({
  root,
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: "unit", root, include: ["tests/survey/**/*.test.ts", "tests/unit/**/*.test.ts"] },
      },
      {
        resolve: { alias },
        test: {
          name: "api",
          root,
          include: ["tests/api/**/*.test.ts"],
          globalSetup: ["tests/support/pg-global-setup.ts"],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "browser",
          root,
          include: ["tests/browser/**/*.test.ts"],
          globalSetup: ["tests/support/web-global-setup.ts", "tests/support/pg-global-setup.ts"],
          testTimeout: 60_000,
          hookTimeout: 240_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
