import { describe, expect, it } from "vitest";
import { parseEnv } from "@/lib/env";

describe("configuration", () => {
  it("has working defaults", () => {
    const env = parseEnv({});
    expect(env.DATABASE_URL).toBe("file:./data/washproof.db");
    expect(env.LOCKOUT_THRESHOLD).toBe(5);
    expect(env.LOCKOUT_MINUTES).toBe(15);
    expect(env.SESSION_IDLE_MINUTES).toBe(30);
  });

  it("names the variable when a value is bad", () => {
    expect(() => parseEnv({ LOCKOUT_THRESHOLD: "five" })).toThrow(/LOCKOUT_THRESHOLD/);
    expect(() => parseEnv({ SMTP_URL: "not a url" })).toThrow(/SMTP_URL/);
    expect(() => parseEnv({ DATABASE_URL: "postgres://x" })).toThrow(/DATABASE_URL/);
  });

  it("requires an absolute database path in production", () => {
    expect(() => parseEnv({ NODE_ENV: "production", DATABASE_URL: "file:./data/x.db" })).toThrow(
      /DATABASE_URL: must be an absolute/,
    );
    expect(
      parseEnv({ NODE_ENV: "production", DATABASE_URL: "file:/var/lib/washproof/x.db" })
        .DATABASE_URL,
    ).toBe("file:/var/lib/washproof/x.db");
  });

  it("refuses an idle timeout longer than the absolute lifetime", () => {
    expect(() => parseEnv({ SESSION_IDLE_MINUTES: "90", SESSION_ABSOLUTE_MINUTES: "60" })).toThrow(
      /SESSION_IDLE_MINUTES/,
    );
  });
});
