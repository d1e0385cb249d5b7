import { describe, expect, it } from "vitest";
import { previewCleanlinessSpec } from "@/lib/specs/preview";

describe("previewCleanlinessSpec", () => {
  it("lists each group's classes, sizes and limit for an area-based specification", () => {
    // [std] ISO 16232:2018 / VDA 19.1:2015: size classes B 5–15 µm … N ≥ 3000 µm; level 17 allows up to 130 000, level 00 allows none.
    const p = previewCleanlinessSpec("A(B-E17/F-G14/H-I4/J-K2/L-N00)");
    expect(p.ok).toBe(true);
    if (!p.ok) return;
    expect(p.basis).toBe("per 1000 cm²");
    expect(p.rows.map((r) => [r.classes, r.sizes, r.applies, r.level, r.limit])).toEqual([
      ["B–E", "5–100 µm", "sum", "17", "130000"],
      ["F–G", "100–200 µm", "sum", "14", "16000"],
      ["H–I", "200–600 µm", "sum", "4", "16"],
      ["J–K", "600–1500 µm", "sum", "2", "4"],
      ["L–N", "≥ 1500 µm", "sum", "00", "0"],
    ]);
  });

  it("reads letters written together as a limit on each class, per component for N()", () => {
    // [std] ISO 16232:2018 notation: EF12 limits E and F each; N() counts per component.
    const each = previewCleanlinessSpec("A(EF12/I0)");
    expect(each.ok && each.rows[0]).toMatchObject({
      classes: "E, F",
      sizes: "50–150 µm",
      applies: "each",
    });
    const perPart = previewCleanlinessSpec("N(C-E32000/J-K0)");
    expect(perPart.ok && perPart.basis).toBe("per component");
    expect(perPart.ok && perPart.rows.map((r) => [r.level, r.limit])).toEqual([
      [null, "32000"],
      [null, "0"],
    ]);
  });

  it("names the character where a malformed specification goes wrong", () => {
    const p = previewCleanlinessSpec("A(B-E17/Z12)");
    expect(p).toEqual({
      ok: false,
      message: expect.stringMatching(/"Z" in "Z12" is not a size class.*\(at character 9\)$/),
      position: 9,
    });
  });

  it("asks for the text when the field is empty, without a position", () => {
    expect(previewCleanlinessSpec("  ")).toMatchObject({ ok: false, position: null });
  });
});
