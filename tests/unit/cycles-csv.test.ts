import { describe, expect, it } from "vitest";
import {
  autoMapCycles,
  CYCLE_FIELDS,
  cycleMappingProblems,
  parseCycleCsv,
  valueFields,
} from "@/lib/cycles/csv";
import { lotHistoryCsv } from "@/lib/cycles/lot-export";

const fields = [
  ...CYCLE_FIELDS,
  ...valueFields([
    { key: "wash.temperature", name: "Bath temperature", unit: "°C" },
    { key: "drying.vacuum", name: "Vacuum end pressure", unit: "mbar" },
  ]),
];
const HEADER =
  "cycle,system,recipe,part_family,lots,baskets,start,end,operator,wash.temperature,drying_vacuum";

describe("cycle log CSV", () => {
  it("maps columns by name and alias, parameter keys written with dots or underscores", () => {
    const m = autoMapCycles(HEADER.split(","), fields);
    expect(m.cycle).toBe("cycle");
    expect(m["value:wash.temperature"]).toBe("wash.temperature");
    expect(m["value:drying.vacuum"]).toBe("drying_vacuum");
    expect(cycleMappingProblems(m, HEADER.split(","), fields)).toEqual([]);
  });

  it("names every required column the file lacks before reading a row", () => {
    const r = parseCycleCsv("cycle,system\nA,B\n", { fields });
    expect(r.fileErrors).toContain('No column holds the recipe code: name one "recipe" or map it.');
    expect(r.rows).toEqual([]);
  });

  it("reads lots from one cell, times without a zone as UTC and values as numbers", () => {
    const r = parseCycleCsv(
      `${HEADER}\nAW3-1,AW-3,R-AW3-VB,PF-VB-210,L1;L2,2,2026-03-04 06:00,2026-03-04 06:40,Ravi,"60,5",20\n`,
      { fields },
    );
    expect(r.errors).toEqual([]);
    expect(r.rows).toEqual([
      {
        line: 2,
        cycle: {
          cycleNumber: "AW3-1",
          system: "AW-3",
          recipe: "R-AW3-VB",
          partFamily: "PF-VB-210",
          lots: ["L1", "L2"],
          baskets: 2,
          startedAt: "2026-03-04T06:00:00.000Z",
          endedAt: "2026-03-04T06:40:00.000Z",
          operator: "Ravi",
          values: { "wash.temperature": 60.5, "drying.vacuum": 20 },
        },
      },
    ]);
  });

  it("answers every bad row with its line and keeps no rows of an invalid file", () => {
    const r = parseCycleCsv(
      [
        HEADER,
        "AW3-1,AW-3,R-AW3-VB,PF-VB-210,L1,2,2026-03-04 06:00,2026-03-04 06:40,Ravi,60,20",
        "AW3-2,AW-3,R-AW3-VB,PF-VB-210,L1,2,2026-03-04 07:00,2026-03-04 06:40,Ravi,hot,20",
        "=cmd,AW-3,R-AW3-VB,PF-VB-210,L1,2,2026-03-04 08:00,2026-03-04 08:40,Ravi,60,20",
      ].join("\n"),
      { fields },
    );
    expect(r.rows).toEqual([]);
    expect(r.errors).toEqual([
      { line: 3, message: 'Bath temperature (°C) — wash.temperature: "hot" is not a number.' },
      { line: 3, message: "End: The end is before the start." },
      {
        line: 4,
        message: 'Column "cycle" starts with "=", which a spreadsheet would run as a formula.',
      },
    ]);
  });
});

describe("lot history CSV", () => {
  it("writes one row per cycle and per run, and defuses a cell a spreadsheet would run", () => {
    const csv = lotHistoryCsv({
      lot: "L1",
      cycles: [
        {
          id: "c1",
          cycleNumber: "AW3-1",
          system: "AW-3",
          systemName: "Washer",
          recipe: "R-AW3-VB",
          version: 2,
          recipeVersionId: "v",
          partFamily: "PF-VB-210",
          lots: ["L1"],
          baskets: 2,
          startedAt: "2026-03-04T06:00:00.000Z",
          endedAt: "2026-03-04T06:40:00.000Z",
          operator: "=HYPERLINK()",
          actualValues: { "wash.temperature": 60 },
          flagged: false,
          flagReasons: [],
          bath: [],
        },
      ],
      runs: [
        {
          id: "r1",
          number: "TR-0001",
          revision: 1,
          testType: "particle_cleanliness",
          status: "verified",
          outcome: "pass",
          performedOn: "2026-03-04",
          cycles: [{ cycleNumber: "AW3-1", samples: 3 }],
        },
      ],
      nonconformances: [
        {
          id: "n1",
          number: "NC-2026-004",
          title: "AW-3 cycle AW3-1 outside its validated range",
          status: "contained",
          severity: "major",
          detectedOn: "2026-03-04",
          names: ["AW-3 cycle AW3-1"],
        },
      ],
    });
    const lines = csv.split("\r\n");
    expect(lines).toHaveLength(4);
    expect(lines[0].split(",")).toHaveLength(22);
    expect(lines[3].split(",")).toHaveLength(22);
    expect(lines[3]).toMatch(/^nonconformance,L1,/);
    expect(lines[3]).toContain("NC-2026-004 AW-3 cycle AW3-1 outside its validated range");
    expect(lines[3]).toContain("Contained");
    expect(lines[1]).toContain("'=HYPERLINK()");
    expect(lines[2]).toContain("TR-0001");
    expect(lines[2]).toContain("AW3-1 (3)");
  });
});
