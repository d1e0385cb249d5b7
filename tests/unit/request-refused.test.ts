import { describe, expect, it } from "vitest";
import { RequestRefused, retryUnlessRefused } from "@/lib/http/refused";

describe("browser queries retry a failure, never a refusal", () => {
  it("asks again up to three times after a failure the server did not refuse", () => {
    const failed = new Error("The list could not be loaded.");
    expect([0, 1, 2, 3].map((n) => retryUnlessRefused(n, failed))).toEqual([
      true,
      true,
      true,
      false,
    ]);
  });
  it("does not ask again after a 4xx: the same request would be refused again", () => {
    expect(retryUnlessRefused(0, new RequestRefused("outcome: Choose one of …"))).toBe(false);
  });
});
