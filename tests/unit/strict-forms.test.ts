import { describe, expect, it } from "vitest";
import { z } from "zod";
import { readForm } from "@/lib/actions/read-form";
import { unknownFormFields } from "@/lib/api/strict-keys";
import { labMethodSchema, methodFormSchema } from "@/lib/schemas/lab-method";
import { particleRunDataSchema, particleSampleSchema, runIdSchema } from "@/lib/schemas/evidence";

// Ordinary forms are strict too: a key the action does not read is refused by name rather than
// dropped (a lower-case class would store no counts and the sample would look clean).

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
    expect(unknownFormFields(particleSampleSchema, raw, [runIdSchema])).toEqual({
      "counts.b": [expect.stringMatching(/did you mean "B"/)],
    });
  });

  it("refuses a known field in the wrong case, naming the field meant", () => {
    const schema = z.object({ reason: z.string() });
    expect(unknownFormFields(schema, { reason: "x", Reason: "y" })).toEqual({
      Reason: [expect.stringMatching(/did you mean "reason"/)],
    });
  });

  it("refuses a field nobody reads, by name", () => {
    const schema = z.object({ versionId: z.string(), comment: z.string() });
    expect(unknownFormFields(schema, { versionId: "v", comment: "c", note: "n" })).toEqual({
      note: ['Unknown field "note".'],
    });
  });

  it("lets through a field the action reads with another schema, and that schema alone", () => {
    const schema = z.object({ versionId: z.string(), comment: z.string() });
    const page = z.object({ documentId: z.string().optional() });
    const form = { versionId: "v", comment: "c", documentId: "d" };
    expect(unknownFormFields(schema, form, [page])).toBe(null);
    expect(unknownFormFields(schema, { ...form, pageNumber: "2" }, [page])).toEqual({
      pageNumber: ['Unknown field "pageNumber".'],
    });
  });

  it("refuses a mis-spelt blank class on the extraction-series form", () => {
    const raw = readForm(
      form({ runId: "r", extractionSeries: "1", blankMeasured: "on", "blankCounts.c": "4" }),
      particleRunDataSchema,
    );
    expect(Object.keys(unknownFormFields(particleRunDataSchema, raw, [runIdSchema]) ?? {})).toEqual(
      ["blankCounts.c"],
    );
  });

  it("reads the fields of whichever kind a lab method form names, and refuses any other", () => {
    const raw = { kind: "analysis", code: "AN-01", name: "Membrane analysis", details: {} };
    expect(unknownFormFields(methodFormSchema, raw, [labMethodSchema])).toBe(null);
    expect(
      unknownFormFields(methodFormSchema, { ...raw, colour: "red" }, [labMethodSchema]),
    ).toEqual({ colour: ['Unknown field "colour".'] });
  });
});
