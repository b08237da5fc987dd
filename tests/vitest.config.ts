import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL("..", import.meta.url));
const alias = {
  "@/": fileURLToPath(new URL("../src/", import.meta.url)),
  "@emails/": fileURLToPath(new URL("../emails/", import.meta.url)),
  // `server-only` throws outside a React Server Component bundle; in tests it is a no-op.
  "server-only": fileURLToPath(new URL("./support/server-only-noop.ts", import.meta.url)),
};

export default defineConfig({
  root,
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: "unit", root, include: ["src/**/*.test.ts", "scripts/**/*.test.ts"], environment: "node" },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          root,
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
