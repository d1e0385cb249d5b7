import { describe, expect, it } from "vitest";
import { EVIDENCE_LIST_DEFAULTS, usableListAddress } from "@/lib/evidence/list-address";
import { evidenceListQuerySchema } from "@/lib/schemas/evidence-list";

const DEFAULTS = EVIDENCE_LIST_DEFAULTS;
const FAMILY = "00000000-0000-4000-8000-000000000001";
const RECIPE = "00000000-0000-4000-8000-000000000002";
const known = { familyIds: new Set([FAMILY]), recipeIds: new Set([RECIPE]) };

describe("an evidence list address the list can use", () => {
  it("keeps a good address as it is", () => {
    const good = {
      ...DEFAULTS,
      partFamilyId: FAMILY,
      recipeId: RECIPE,
      version: "3",
      outcome: "fail",
      from: "2026-01-01",
      sort: "number",
      dir: "asc",
      page: "2",
    };
    expect(usableListAddress(good, DEFAULTS, known)).toEqual(good);
  });

  it("sets back what the server would refuse, and only that", () => {
    const bad = {
      ...DEFAULTS,
      outcome: "maybe",
      from: "yesterday",
      sort: "date",
      dir: "sideways",
      page: "-1",
      testType: "particle_cleanliness",
    };
    const usable = usableListAddress(bad, DEFAULTS, known);
    expect(usable).toEqual({ ...DEFAULTS, testType: "particle_cleanliness" });
    // What is left is what the server's own schema accepts.
    expect(evidenceListQuerySchema.safeParse(usable).success).toBe(true);
    expect(evidenceListQuerySchema.safeParse(bad).success).toBe(false);
  });

  it("drops a family or recipe that is not in the lists, and the version with its recipe", () => {
    const unknown = "00000000-0000-4000-8000-00000000dead";
    expect(
      usableListAddress(
        { ...DEFAULTS, partFamilyId: unknown, recipeId: unknown, version: "2" },
        DEFAULTS,
        known,
      ),
    ).toEqual(DEFAULTS);
  });

  it("leaves a mistyped version number for the form to point out", () => {
    const typed = { ...DEFAULTS, recipeId: RECIPE, version: "-4" };
    expect(usableListAddress(typed, DEFAULTS, known)).toEqual(typed);
  });
});
