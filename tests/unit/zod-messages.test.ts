import { describe, expect, it } from "vitest";
import { z } from "zod";
import { plainMessage } from "@/lib/schemas/messages";
import { particleRunDataSchema } from "@/lib/schemas/evidence";
import { invalid } from "@/lib/actions/result";

const messageOf = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value);
  if (r.success) throw new Error(`expected ${JSON.stringify(value)} to be refused`);
  return r.error.issues.map((i) => i.message);
};

// Every expectation below is our own wording (common practice for form messages), not a standard.
describe("the one zod error map", () => {
  it("says the character limit in plain words instead of zod's developer text", () => {
    expect(messageOf(z.string().max(200), "x".repeat(201))).toEqual(["At most 200 characters."]);
    expect(messageOf(z.string().max(1), "xy")).toEqual(["At most 1 character."]);
    expect(messageOf(z.string().min(8), "short")).toEqual(["At least 8 characters."]);
  });
  it("asks for an empty or missing field to be filled in", () => {
    expect(messageOf(z.string().min(1), "")).toEqual(["Fill in this field."]);
    expect(messageOf(z.string(), undefined)).toEqual(["Fill in this field."]);
    expect(messageOf(z.number(), null)).toEqual(["Fill in this field."]);
  });
  it("names the kind of value wanted", () => {
    expect(messageOf(z.number(), "abc")).toEqual(["Enter a number."]);
    expect(messageOf(z.number(), Number.NaN)).toEqual(["Enter a number."]);
    expect(messageOf(z.number().int(), 1.5)).toEqual(["Enter a whole number."]);
    expect(messageOf(z.boolean(), "maybe")).toEqual(["Answer yes or no."]);
  });
  it("states numeric limits, grouped for reading, and whether the limit itself is allowed", () => {
    expect(messageOf(z.number().max(100_000), 150_000)).toEqual(["At most 100,000."]);
    expect(messageOf(z.number().min(5), 4)).toEqual(["At least 5."]);
    expect(messageOf(z.number().positive(), 0)).toEqual(["More than 0."]);
    expect(messageOf(z.number().lt(10), 10)).toEqual(["Less than 10."]);
    expect(messageOf(z.number().multipleOf(5), 3)).toEqual(["Use a multiple of 5."]);
  });
  it("counts list entries", () => {
    expect(messageOf(z.array(z.string()).min(1), [])).toEqual(["Choose or enter at least one."]);
    expect(messageOf(z.array(z.string()).max(2), ["a", "b", "c"])).toEqual(["At most 2 entries."]);
  });
  it("explains formats and choices", () => {
    expect(messageOf(z.string().email(), "someone")).toEqual([
      "Enter an e-mail address, like name@example.com.",
    ]);
    expect(messageOf(z.string().uuid(), "x")).toEqual(["Choose from the list."]);
    expect(messageOf(z.iso.date(), "2026-13-01")).toEqual(["Enter a date as YYYY-MM-DD."]);
    expect(messageOf(z.string().regex(/^CR-/), "X")).toEqual(["Check the format of this value."]);
    expect(messageOf(z.string().startsWith("wp_"), "x")).toEqual(["Must start with “wp_”."]);
    expect(messageOf(z.enum(["minor", "major"]), "huge")).toEqual(["Choose one of: minor, major."]);
    expect(messageOf(z.literal("yes"), "no")).toEqual(["Must be yes."]);
    expect(messageOf(z.object({ a: z.string() }).strict(), { a: "x", B: 1 })).toEqual([
      "Not a field this form or request accepts: B.",
    ]);
  });
  it("keeps a schema's own message where one was written", () => {
    expect(messageOf(z.string().max(60, "Use at most 60 characters."), "x".repeat(61))).toEqual([
      "Use at most 60 characters.",
    ]);
  });
  it("never lets zod's own phrasing through for any issue code", () => {
    const raw = /Too big|Too small|Invalid input|Invalid option|expected|received|<=|>=/;
    const samples: [z.ZodType, unknown][] = [
      [z.string().max(3), "abcd"],
      [z.number(), "x"],
      [z.union([z.string(), z.number()]), true],
      [z.record(z.enum(["a"]), z.number()), { b: 1 }],
      [z.map(z.string(), z.number()), new Map([["a", "x"]])],
      [z.object({ a: z.string() }), undefined],
      [z.string().refine(() => false), "x"],
      [z.date().max(new Date(0)), new Date()],
    ];
    for (const [schema, value] of samples)
      for (const message of messageOf(schema, value)) expect(message).not.toMatch(raw);
  });
  it("is the same function the config applies", () => {
    expect(
      plainMessage({
        code: "too_big",
        origin: "string",
        maximum: 200,
        inclusive: true,
        input: "",
        path: [],
      } as never),
    ).toBe("At most 200 characters.");
  });
});

describe("extraction series without the blank", () => {
  it("names the “Blank value measured” box instead of failing on counts the form never showed", () => {
    const r = particleRunDataSchema.safeParse({ runId: "x", extractionSeries: "100, 30, 8" });
    expect(r.success).toBe(false);
    const failure = invalid(r.error!);
    expect(failure).toMatchObject({ ok: false });
    const fieldErrors = (failure as { fieldErrors: Record<string, string[]> }).fieldErrors;
    expect(Object.keys(fieldErrors)).toEqual(["blankMeasured"]);
    expect(fieldErrors.blankMeasured[0]).toContain("Blank value measured");
  });
  it("saves with the box ticked and no class counted", () => {
    expect(
      particleRunDataSchema.parse({ extractionSeries: "100, 30, 8", blankMeasured: "on" }),
    ).toEqual({ extractionSeries: [100, 30, 8], blank: { counts: {}, largestUm: null } });
  });
});
