import { describe, expect, it } from "vitest";
import { testEntryCautions } from "@/lib/lab-report/cautions";

describe("cautions on the test-entry screens [practice]", () => {
  it("warns of hot parts on every test, as a dry-heat burn", () => {
    for (const type of ["visual", "dryness", "rinse_conductivity", "wetting_tension"] as const) {
      const kinds = testEntryCautions(type).map((c) => c.kind);
      expect(kinds).toContain("hot_parts");
    }
    expect(testEntryCautions("visual")[0].text).toMatch(/dry-heat burn/);
  });

  it("adds the extraction liquids for particle and gravimetric tests, and the UV-A lamp for UV inspection only", () => {
    expect(testEntryCautions("particle_cleanliness").map((c) => c.kind)).toEqual([
      "hot_parts",
      "extraction_liquid",
    ]);
    expect(testEntryCautions("gravimetric").map((c) => c.kind)).toContain("extraction_liquid");
    expect(testEntryCautions("uv_inspection").map((c) => c.kind)).toEqual(["hot_parts", "uv_a"]);
    expect(testEntryCautions("visual").map((c) => c.kind)).not.toContain("uv_a");
  });
});
