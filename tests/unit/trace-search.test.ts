import { describe, expect, it } from "vitest";
import { matchParameters, traceScopes, type TraceParameter } from "@/lib/trace/parameter-search";

// Invented demo-style rows: two systems, three recipes.
const row = (
  systemCode: string,
  recipeCode: string,
  key: string,
  name: string,
  unit: string,
  stage: string,
): TraceParameter => ({
  key,
  name,
  unit,
  stage,
  recipeId: `r-${recipeCode}`,
  recipeCode,
  recipeName: `Recipe ${recipeCode}`,
  systemId: `s-${systemCode}`,
  systemCode,
  systemName: `System ${systemCode}`,
  versions: 1,
});
const ROWS = [
  row("AW-3", "R-AW3-VB", "wash.temperature", "Bath temperature", "°C", "Wash"),
  row("AW-3", "R-AW3-VB", "wash.concentration", "Detergent concentration", "%", "Wash"),
  row("AW-3", "R-AW3-PH", "wash.temperature", "Bath temperature", "°C", "Wash"),
  row("SC-1", "R-SC1-SF", "drying.temperature", "Drying temperature", "°C", "Drying"),
  row(
    "SC-1",
    "R-SC1-SF",
    "rinse.conductivity_max",
    "Final rinse conductivity",
    "µS/cm",
    "Final rinse",
  ),
];

describe("trace parameter search", () => {
  it("narrows by system, then recipe, then every typed word", () => {
    expect(matchParameters(ROWS, {}).total).toBe(5);
    expect(matchParameters(ROWS, { systemId: "s-SC-1" }).items.map((p) => p.key)).toEqual([
      "drying.temperature",
      "rinse.conductivity_max",
    ]);
    expect(
      matchParameters(ROWS, { recipeId: "r-R-AW3-VB", q: "temp" }).items.map((p) => p.recipeCode),
    ).toEqual(["R-AW3-VB"]);
    expect(matchParameters(ROWS, { q: "drying TEMP" }).items.map((p) => p.key)).toEqual([
      "drying.temperature",
    ]);
    expect(matchParameters(ROWS, { q: "wash sc-1" }).total).toBe(0);
  });

  it("matches % and _ literally, and finds nothing for SQL", () => {
    expect(matchParameters(ROWS, { q: "%" }).items.map((p) => p.key)).toEqual([
      "wash.concentration",
    ]);
    expect(matchParameters(ROWS, { q: "_" }).items.map((p) => p.key)).toEqual([
      "rinse.conductivity_max",
    ]);
    expect(matchParameters(ROWS, { q: "' OR 1=1 --" }).total).toBe(0);
  });

  it("sends the first matches only and counts the rest", () => {
    const many = Array.from({ length: 95 }, (_, i) =>
      row("AW-3", "R-AW3-VB", `p.${i}`, `Parameter ${i}`, "s", "Wash"),
    );
    const page = matchParameters(many, { q: "parameter" });
    expect(page.total).toBe(95);
    expect(page.items).toHaveLength(40);
    expect(page.items[0].key).toBe("p.0");
  });

  it("lists each system and recipe once, with the recipe's system", () => {
    const scopes = traceScopes(ROWS);
    expect(scopes.systems.map((s) => s.label)).toEqual([
      "AW-3 · System AW-3",
      "SC-1 · System SC-1",
    ]);
    expect(scopes.recipes).toEqual([
      { id: "r-R-AW3-VB", label: "R-AW3-VB · Recipe R-AW3-VB", systemId: "s-AW-3" },
      { id: "r-R-AW3-PH", label: "R-AW3-PH · Recipe R-AW3-PH", systemId: "s-AW-3" },
      { id: "r-R-SC1-SF", label: "R-SC1-SF · Recipe R-SC1-SF", systemId: "s-SC-1" },
    ]);
  });
});
