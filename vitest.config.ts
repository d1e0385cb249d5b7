import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ["tests/unit/**/*.test.ts"],
    environment: "node",
    pool: "forks",
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
