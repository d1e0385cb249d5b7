import { describe, expect, it } from "vitest";
import { autoMapMasterData, groupStages, parseMasterDataCsv } from "@/lib/plant/csv-master-data";

describe("part families from CSV", () => {
  const good = `Code;Name;Part numbers;Material;Wetted area cm2;Wetted area method;Spec code
PF-MN-05;Manifold block MN-05;MN-05-A, MN-05-B;Aluminium 6082-T6;612,5;cad_model;CS-MN-05
PF-CV-07;Check valve CV-07;CV-07-1;Brass CW614N;48;measured;CS-MN-05
`;
  it("reads every row with the entry form's rules, semicolons and decimal commas included", () => {
    const r = parseMasterDataCsv("part_families", good);
    expect(r.errors).toEqual([]);
    expect(r.fileErrors).toEqual([]);
    expect(r.rows.map((f) => [f.code, f.partNumbers, f.wettedAreaCm2, f.specCode])).toEqual([
      ["PF-MN-05", ["MN-05-A", "MN-05-B"], 612.5, "CS-MN-05"],
      ["PF-CV-07", ["CV-07-1"], 48, "CS-MN-05"],
    ]);
  });

  it("is all or nothing: one bad row names its line and field, and no row is returned", () => {
    const bad =
      good +
      "PF-XX-01;Broken part;;Steel;0;guessed;CS-MN-05\nPF-MN-05;Twice;;Steel;10;measured;CS-MN-05\n";
    const r = parseMasterDataCsv("part_families", bad);
    expect(r.rows).toEqual([]);
    expect(r.errors).toEqual([
      { line: 4, message: "wettedAreaCm2: Wetted area must be greater than 0 cm²." },
      { line: 4, message: expect.stringMatching(/^wettedAreaMethod: /) },
      { line: 5, message: "PF-MN-05 appears twice in the file (first on line 2)." },
    ]);
  });

  it("says which needed column is missing, and refuses a formula in a cell", () => {
    expect(parseMasterDataCsv("part_families", "Code;Name\nPF-1;One\n").fileErrors).toEqual([
      'No column holds material: name one "material" or map it.',
      'No column holds wetted area (cm²): name one "wetted_area_cm2" or map it.',
      'No column holds specification code: name one "spec_code" or map it.',
    ]);
    const r = parseMasterDataCsv("part_families", good.replace("Brass CW614N", "=HYPERLINK(1)"));
    expect(r.errors).toEqual([
      {
        line: 3,
        message: 'Column "Material" starts with "=", which a spreadsheet would run as a formula.',
      },
    ]);
    expect(parseMasterDataCsv("part_families", "").fileErrors).toEqual([
      "The file is empty: it has no header row and no data.",
    ]);
  });

  it("follows a column mapping from the mapping screen", () => {
    const text = "Teil;Bezeichnung;Werkstoff;Fläche;Spez\nPF-Z-1;Zapfen;Stahl;12;CS-1\n";
    const mapping = {
      code: "Teil",
      name: "Bezeichnung",
      material: "Werkstoff",
      wetted_area_cm2: "Fläche",
      spec_code: "Spez",
    };
    expect(autoMapMasterData("part_families", ["Teil"])).toEqual({});
    expect(parseMasterDataCsv("part_families", text, { mapping }).rows[0]).toMatchObject({
      code: "PF-Z-1",
      wettedAreaCm2: 12,
      wettedAreaMethod: "estimated",
    });
  });
});

describe("specifications from CSV", () => {
  it("names the position of a malformed cleanliness code on its line", () => {
    const text =
      "code,name,customer,document_number,revision,ccc,gravimetric_limit_mg,gravimetric_basis,customer_approves_changes\n" +
      "CS-MN-05,Manifold,Ostwick Fluid Power,OFP-CL-220,A,A(B-E17/F-G14),3.5,per_component,yes\n" +
      "CS-CV-07,Check valve,Ostwick Fluid Power,OFP-CL-221,B,A(B-E17/Z12),,,no\n";
    const r = parseMasterDataCsv("specifications", text);
    expect(r.rows).toEqual([]);
    expect(r.errors).toEqual([
      {
        line: 3,
        message: expect.stringMatching(
          /^ccc: "Z" in "Z12" is not a size class.*\(at character 9\)$/,
        ),
      },
    ]);
    const ok = parseMasterDataCsv("specifications", text.split("\n").slice(0, 2).join("\n"));
    expect(ok.rows[0]).toMatchObject({
      code: "CS-MN-05",
      gravimetricLimitMg: 3.5,
      customerApprovesChanges: true,
    });
  });
});

describe("recipe parameters from CSV", () => {
  const header =
    "stage,stage_kind,stage_mode,key,name,kind,setpoint,unit,validated_low,validated_high,critical\n";
  const rows = [
    "Wash,wash,ultrasonic,wash.temperature,Bath temperature,temperature,60,°C,55,65,yes",
    "Wash,wash,ultrasonic,wash.time,Wash time,time,300,s,240,360,yes",
    "Drying,drying,vacuum_drying,drying.temperature,Drying temperature,drying_temperature,110,°C,100,120,yes",
    "Loading,other,,loading.pattern,Load pattern,load_pattern,3,pattern no.,,,yes",
  ];
  it("groups consecutive rows into stages in the file's order", () => {
    const r = parseMasterDataCsv("recipe_parameters", header + rows.join("\n"));
    expect(r.errors).toEqual([]);
    expect(groupStages(r.rows).map((s) => [s.name, s.kind, s.mode, s.parameters.length])).toEqual([
      ["Wash", "wash", "ultrasonic", 2],
      ["Drying", "drying", "vacuum_drying", 1],
      ["Loading", "other", null, 1],
    ]);
  });

  it("refuses physical limits, an own-range breach and a foreign unit per line, and stages out of order", () => {
    const bad = [
      rows[0].replace(",60,", ",70,"),
      rows[1].replace(",s,", ",°C,"),
      rows[2].replace(",110,", ",1e9,"),
    ];
    const r = parseMasterDataCsv("recipe_parameters", header + bad.join("\n"));
    // Line 4 breaks both rules: 1e9 °C is beyond any dryer and outside its own 100–120 °C.
    expect(r.errors.map((e) => [e.line, e.message.split(":")[0]])).toEqual([
      [2, "setpoint"],
      [3, "unit"],
      [4, "setpoint"],
      [4, "setpoint"],
    ]);
    const reordered = parseMasterDataCsv(
      "recipe_parameters",
      header + [rows[2], rows[0]].join("\n"),
    );
    expect(reordered.errors).toEqual([
      {
        line: 3,
        message: expect.stringMatching(/Stage 2 \(Wash\) is a wash after stage 1 \(Drying\)/),
      },
    ]);
    expect(reordered.rows).toEqual([]);
  });
});
