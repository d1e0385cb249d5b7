import { describe, expect, it } from "vitest";
import { runDefaultsFromQuery } from "@/lib/evidence/run-defaults";

const changes = [
  { id: "cr-1", number: "CR-2026-002", toVersionId: "v3", partFamilyId: null },
  { id: "cr-2", number: "CR-2026-003", toVersionId: "v9", partFamilyId: "fam-7" },
];

describe("a new run opened from a change request's gate", () => {
  it("starts on the change, its proposed version and the required test", () => {
    expect(
      runDefaultsFromQuery(
        { change: "cr-1", testType: "particle_cleanliness", samples: "29" },
        changes,
      ),
    ).toEqual({
      changeRequestId: "cr-1",
      recipeVersionId: "v3",
      partFamilyId: undefined,
      testType: "particle_cleanliness",
      requirement: "Particle cleanliness on 29 parts",
    });
  });
  it("takes the family a change adds", () => {
    expect(runDefaultsFromQuery({ change: "cr-2" }, changes)).toMatchObject({
      partFamilyId: "fam-7",
      recipeVersionId: "v9",
      requirement: undefined,
    });
  });
  it("ignores a change or test type that is not on offer", () => {
    expect(runDefaultsFromQuery({ change: "cr-x", testType: "Particle" }, changes)).toEqual({});
    expect(runDefaultsFromQuery({ testType: ["gravimetric", "visual"] }, changes)).toEqual({});
  });
});

describe("a new run opened from a control plan's due test", () => {
  const offered = { versions: [{ id: "v3" }], families: [{ id: "fam-7" }] };
  it("starts on the combination and the test, tied to no change request", () => {
    expect(
      runDefaultsFromQuery(
        { recipeVersion: "v3", partFamily: "fam-7", testType: "dryness", samples: "3" },
        changes,
        offered,
      ),
    ).toEqual({ recipeVersionId: "v3", partFamilyId: "fam-7", testType: "dryness" });
  });
  it("ignores a version or family that is not on offer", () => {
    expect(
      runDefaultsFromQuery({ recipeVersion: "v4", partFamily: "fam-9" }, changes, offered),
    ).toEqual({});
  });
});
