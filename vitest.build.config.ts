import { defineConfig } from "vitest/config";
import unit from "./vitest.config";

/**
 * Tests that need the production build (`next build`) and start the server
 * themselves; `npm test` runs them after the build. Kept out of the unit
 * config so `npx vitest run` stays build-free.
 */
export default defineConfig({
  ...unit,
  test: {
    ...unit.test,
    include: ["tests/build/**/*.test.ts"],
    testTimeout: 120_000,
    hookTimeout: 90_000,
  },
});
