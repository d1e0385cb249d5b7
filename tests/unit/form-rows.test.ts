import { describe, expect, it } from "vitest";
import { appendRow, moveRow, removeRow, rowsOf, updateRow, valuesOf } from "@/lib/forms/rows";

describe("row list of an editor", () => {
  const start = () => rowsOf([{ name: "Wash" }, { name: "Rinse" }, { name: "Dry" }]);

  it("gives each row a key of its own and leaves it out of the values", () => {
    const rows = start();
    expect(new Set(rows.map((r) => r.key)).size).toBe(3);
    expect(valuesOf(rows)).toEqual([{ name: "Wash" }, { name: "Rinse" }, { name: "Dry" }]);
  });

  it("keeps the keys of the rows below a removed one, so their inputs stay with them", () => {
    const rows = start();
    const after = removeRow(rows, 0);
    expect(after.map((r) => r.key)).toEqual([rows[1].key, rows[2].key]);
    expect(valuesOf(after)).toEqual([{ name: "Rinse" }, { name: "Dry" }]);
    expect(rows).toHaveLength(3); // the old list is not changed in place: React compares by identity
  });

  it("adds a row with a fresh key at the end", () => {
    const rows = start();
    const after = appendRow(rows, { name: "Final rinse" });
    expect(valuesOf(after).at(-1)).toEqual({ name: "Final rinse" });
    expect(rows.map((r) => r.key)).not.toContain(after[3].key);
  });

  it("merges a patch into one row, or replaces its value through a function, keeping its key", () => {
    const rows = start();
    const patched = updateRow(rows, 1, { name: "Deionised rinse" });
    expect(valuesOf(patched)).toEqual([
      { name: "Wash" },
      { name: "Deionised rinse" },
      { name: "Dry" },
    ]);
    expect(patched[1].key).toBe(rows[1].key);
    expect(patched[0]).toBe(rows[0]);
    const replaced = updateRow(patched, 2, (v) => ({ name: `${v.name} (vacuum)` }));
    expect(replaced[2].value).toEqual({ name: "Dry (vacuum)" });
  });

  it("moves a row up or down with its key, and leaves the list as it is at either end", () => {
    const rows = rowsOf([{ name: "Wash" }, { name: "Dry" }, { name: "Rinse" }]);
    const moved = moveRow(rows, 2, -1);
    expect(valuesOf(moved)).toEqual([{ name: "Wash" }, { name: "Rinse" }, { name: "Dry" }]);
    expect(moved.map((r) => r.key)).toEqual([rows[0].key, rows[2].key, rows[1].key]);
    expect(valuesOf(moveRow(rows, 0, -1))).toEqual(valuesOf(rows));
    expect(valuesOf(moveRow(rows, 2, 1))).toEqual(valuesOf(rows));
  });
});
