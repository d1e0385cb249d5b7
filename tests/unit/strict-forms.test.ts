import { describe, expect, it } from "vitest";
import { z } from "zod";
import { readForm } from "@/lib/actions/read-form";
import { misnamedFormFields } from "@/lib/api/strict-keys";
import { particleRunDataSchema, particleSampleSchema } from "@/lib/schemas/evidence";

// Ordinary forms are strict too: a key that can only be a mistake is refused by name rather
// than dropped (a lower-case class would store no counts and the sample would look clean).

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}

describe("strict form fields", () => {
  it("refuses a lower-case size class under the counts the form knows", () => {
    const raw = readForm(
      form({
        runId: "r",
        sampleLabel: "VB-1",
        components: "1",
        "counts.B": "3",
        "counts.b": "100",
      }),
      particleSampleSchema,
    );
    expect(misnamedFormFields(particleSampleSchema, raw)).toEqual({
      "counts.b": [expect.stringMatching(/did you mean "B"/)],
    });
  });

  it("refuses a known field in the wrong case, naming the field meant", () => {
    const schema = z.object({ reason: z.string() });
    expect(misnamedFormFields(schema, { reason: "x", Reason: "y" })).toEqual({
      Reason: [expect.stringMatching(/did you mean "reason"/)],
    });
  });

  it("lets the page's own hidden fields through (a document id that only says what to refresh)", () => {
    const schema = z.object({ versionId: z.string(), comment: z.string() });
    expect(misnamedFormFields(schema, { versionId: "v", comment: "c", documentId: "d" })).toBe(
      null,
    );
  });

  it("refuses a mis-spelt blank class on the extraction-series form", () => {
    const raw = readForm(
      form({ runId: "r", extractionSeries: "1", blankMeasured: "on", "blankCounts.c": "4" }),
      particleRunDataSchema,
    );
    expect(Object.keys(misnamedFormFields(particleRunDataSchema, raw) ?? {})).toEqual([
      "blankCounts.c",
    ]);
  });
});
