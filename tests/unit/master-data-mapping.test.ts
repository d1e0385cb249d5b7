import { describe, expect, it } from "vitest";
import { autoMapMasterData } from "@/lib/plant/csv-master-data";
import { masterDataMappingProblems } from "@/lib/plant/master-data-mapping";

describe("masterDataMappingProblems", () => {
  it("accepts a file whose headers are our column names", () => {
    const headers = ["code", "name", "material", "wetted_area_cm2", "spec_code"];
    expect(
      masterDataMappingProblems(
        "part_families",
        autoMapMasterData("part_families", headers),
        headers,
      ),
    ).toEqual([]);
  });

  it("names each required field the file does not hold, and a column mapped twice", () => {
    const headers = ["Teil", "Bezeichnung", "Werkstoff", "Fläche"];
    const problems = masterDataMappingProblems(
      "part_families",
      { code: "Teil", name: "Teil", material: "Werkstoff", wetted_area_cm2: "Fläche" },
      headers,
    );
    expect(problems).toEqual([
      'No column holds specification code: name one "spec_code" or map it.',
      'The column "Teil" is mapped to two fields.',
    ]);
  });

  it("refuses a mapping to a column that is not in the file", () => {
    const problems = masterDataMappingProblems(
      "specifications",
      {
        code: "Code",
        name: "Title",
        customer: "Kunde",
        document_number: "Doc",
        revision: "Rev",
        ccc: "CCC",
      },
      ["Code", "Title", "Doc", "Rev", "CCC"],
    );
    expect(problems).toEqual(['The column "Kunde" chosen for customer is not in the file.']);
  });
});
