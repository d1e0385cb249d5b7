import { describe, expect, it } from "vitest";
import { observationOutcome } from "@/lib/evidence/outcomes/observation";
import { observationSampleSchema } from "@/lib/schemas/evidence";

const sample = (acceptable: "yes" | "no", observation?: string) => ({
  sampleLabel: "V-1",
  worstCase: false,
  data: observationSampleSchema.parse({ sampleLabel: "V-1", acceptable, observation }),
});

// [practice] an inspection by eye is accepted on the inspector's word backed by a photo of what was seen.
describe("visual, UV and dryness outcome", () => {
  it("passes an acceptable sample with a photo", () => {
    const out = observationOutcome("visual", { samples: [sample("yes")], photoCount: 1 });
    expect(out.samples[0].lines).toEqual(["No stains or visible residue"]);
    expect(out.checks).toEqual([
      { kind: "acceptance", title: "Photos", pass: true, lines: ["1 photo(s) attached"] },
    ]);
    expect(out.outcome).toBe("pass");
  });

  it("fails an unacceptable sample, in the words of its test type", () => {
    const out = observationOutcome("dryness", {
      samples: [sample("no", "drops in the blind holes")],
      photoCount: 2,
    });
    expect(out.samples[0].lines).toEqual(["Water found: drops in the blind holes"]);
    expect(out.outcome).toBe("fail");
    expect(
      observationOutcome("uv_inspection", { samples: [sample("no")], photoCount: 1 }).samples[0]
        .lines,
    ).toEqual(["Oil film seen under UV"]);
  });

  it("waits for a photo before deciding, pass or fail", () => {
    expect(observationOutcome("visual", { samples: [sample("yes")], photoCount: 0 }).outcome).toBe(
      "incomplete",
    );
    expect(observationOutcome("visual", { samples: [sample("no")], photoCount: 0 }).outcome).toBe(
      "incomplete",
    );
  });
});
