import { describe, expect, it } from "vitest";
import { columnsNeedMatching } from "@/lib/forms/csv-mapping";

describe("when a CSV file's columns need matching", () => {
  it("not for a file whose every column matched one of ours", () => {
    expect(columnsNeedMatching(["sample", "B"], { sampleLabel: "sample", B: "B" }, [])).toBe(false);
  });
  it("for a column of the file that matches none of ours, or a problem with the matching", () => {
    expect(columnsNeedMatching(["sample", "50-100 µm"], { sampleLabel: "sample" }, [])).toBe(true);
    expect(columnsNeedMatching(["sample"], { sampleLabel: "sample" }, ["Match Components."])).toBe(
      true,
    );
  });
  it("not before a file is read", () => {
    expect(columnsNeedMatching([], {}, ["Match Sample."])).toBe(false);
  });
});
