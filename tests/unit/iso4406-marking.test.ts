import { describe, expect, it } from "vitest";
import { iso4406CodeMarked } from "@/lib/cleanliness";

describe("ISO 4406 channels with fewer than 20 particles counted", () => {
  it("marks each such channel with ≥ and names it", () => {
    // [std] ISO 4406:2021 worked example (standards.md §2): 3000 / 500 / 7 per mL → 19/16/10.
    // [memory] ISO 4406: a channel with a raw count below 20 is labelled ≥. 10 mL analysed: 70 counted in R14 — not marked.
    expect(iso4406CodeMarked([3000, 500, 7], [30000, 5000, 70])).toEqual({
      code: "19/16/10",
      weakChannels: [],
    });
    // 2 mL analysed: R14 holds 14 particles counted (< 20) → ≥10
    expect(iso4406CodeMarked([3000, 500, 7], [6000, 1000, 14])).toEqual({
      code: "19/16/≥10",
      weakChannels: ["R14"],
    });
  });

  it("counts 20 as enough and refuses counts it cannot read", () => {
    expect(iso4406CodeMarked([3000, 500, 7], [6000, 1000, 20]).code).toBe("19/16/10");
    expect(() => iso4406CodeMarked([3000, 500, 7], [6000, 1000, Number.NaN])).toThrow(/counted/);
  });
});
