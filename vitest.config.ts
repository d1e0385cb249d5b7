import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ["tests/unit/**/*.test.ts"],
    environment: "node",
    pool: "forks",
    // Vitest runs one worker fewer than the cores by default: one worker on these two-core machines.
    // Each file's time is mostly importing the app's modules, so two workers finish in about 3/4 of the time.
    maxWorkers: 2,
    // Service tests each open a temporary SQLite file; hashing with argon2 is slow by design.
    testTimeout: 20_000,
    // Some suites seed the whole demo plant before their tests; a busy machine needs the headroom.
    hookTimeout: 60_000,
    server: { deps: { inline: ["server-only"] } },
    alias: {
      "server-only": new URL("./tests/unit/support/server-only-stub.ts", import.meta.url).pathname,
    },
  },
});
