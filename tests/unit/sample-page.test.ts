import { describe, expect, it } from "vitest";
import { readSamplePage, samplePage, SAMPLES_PER_PAGE } from "@/lib/evidence/sample-page";

describe("a run's samples shown a page at a time", () => {
  const all = Array.from({ length: 100_000 }, (_, i) => `S${i + 1}`);

  it("shows 50 of 100,000 samples, starting where the page says", () => {
    expect(SAMPLES_PER_PAGE).toBe(50);
    const third = samplePage(all, 3);
    expect(third).toMatchObject({ page: 3, pages: 2000, from: 101, to: 150, total: 100_000 });
    expect(third.items).toHaveLength(50);
    expect(third.items[0]).toBe("S101");
    const last = samplePage(all, 2000);
    expect(last.items.at(-1)).toBe("S100000");
  });

  it("shows the nearest real page for one out of range, and one page for a short run", () => {
    expect(samplePage(all, 99_999).page).toBe(2000);
    expect(samplePage(all, 0).page).toBe(1);
    expect(samplePage(["a", "b"], 5)).toEqual({
      items: ["a", "b"],
      page: 1,
      pages: 1,
      from: 1,
      to: 2,
      total: 2,
    });
    expect(samplePage([], 1)).toEqual({ items: [], page: 1, pages: 1, from: 0, to: 0, total: 0 });
    const partial = samplePage(
      Array.from({ length: 120 }, (_, i) => i),
      3,
    );
    expect(partial).toMatchObject({ from: 101, to: 120 });
  });

  it("reads the page number from the URL and ignores anything else", () => {
    expect(readSamplePage("7")).toBe(7);
    expect(readSamplePage(["2", "9"])).toBe(2);
    for (const bad of [undefined, "", "-1", "1e9", "abc", "0x10", "99999999"])
      expect(readSamplePage(bad), String(bad)).toBe(1);
    expect(readSamplePage("0")).toBe(1);
  });
});
