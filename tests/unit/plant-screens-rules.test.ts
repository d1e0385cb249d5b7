import { describe, expect, it } from "vitest";
import { hazardsOfEquipment } from "@/lib/plant/equipment-hazards";
import { letterheadLine } from "@/lib/pdf/letterhead";
import { createSystemSchema } from "@/lib/schemas/system";
import { TEXT_CONTROL_MESSAGE, TEXT_SURROGATE_MESSAGE } from "@/lib/schemas/text";

const stage = (
  kind: string,
  capabilities: string[],
  extra: { tankVolumeL?: number | null; filterRatingUm?: number | null } = {},
) => ({
  kind,
  capabilities,
  tankVolumeL: extra.tankVolumeL ?? null,
  filterRatingUm: extra.filterRatingUm ?? null,
});
const kinds = (stages: ReturnType<typeof stage>[]) =>
  hazardsOfEquipment(stages)
    .map((h) => h.kind)
    .sort();

describe("the cautions shown while a washer's equipment is set", () => {
  it("a heated ultrasonic wash tank with a filter: burn, chemical, noise and isolation [practice]", () => {
    expect(
      kinds([stage("wash", ["ultrasonic", "flood"], { tankVolumeL: 600, filterRatingUm: 25 })]),
    ).toEqual(["burn", "chemical", "isolation", "noise"]);
  });

  it("a vacuum dryer: hot parts and the dryer's heat; a flood rinse without a tank or filter: none", () => {
    // [practice] a dryer's hot air, walls and parts burn by contact: a dry-heat burn, not a scald
    expect(kinds([stage("drying", ["vacuum_drying"])])).toEqual(["dry_heat", "hot_parts"]);
    const [dryer] = hazardsOfEquipment([stage("drying", ["hot_air_drying"])]);
    expect(dryer.text).toMatch(/dry-heat contact burn, not a scald/);
    expect(kinds([stage("rinse", ["flood"])])).toEqual([]);
  });

  it("each caution once, however many stages call for it", () => {
    const all = hazardsOfEquipment([
      stage("wash", ["ultrasonic"], { tankVolumeL: 500 }),
      stage("wash", ["ultrasonic"], { tankVolumeL: 500 }),
      stage("drying", ["hot_air_drying"]),
    ]);
    expect(all.map((h) => h.kind).sort()).toEqual(["burn", "chemical", "dry_heat", "noise"]);
  });

  it("spray and injection stages carry the pressure caution [practice]", () => {
    expect(kinds([stage("wash", ["spray", "injection"])])).toEqual(["chemical", "pressure"]);
  });
});

describe("the PDF header's company and site", () => {
  it("joins company and site, and drops the company when the site's name already carries it", () => {
    expect(
      letterheadLine({ companyName: "Harrowgate Hydraulik GmbH", siteName: "Werk Tallbrook" }),
    ).toBe("Harrowgate Hydraulik GmbH · Werk Tallbrook");
    expect(
      letterheadLine({
        companyName: "Fennmoor Fluidtech",
        siteName: "Fennmoor Fluidtech — Larchfield plant",
      }),
    ).toBe("Fennmoor Fluidtech — Larchfield plant");
    expect(letterheadLine({ companyName: "Harrowgate Hydraulik GmbH", siteName: null })).toBe(
      "Harrowgate Hydraulik GmbH",
    );
    expect(letterheadLine({ companyName: null, siteName: null })).toBeNull();
  });
});

describe("a washer's texts are stored as typed or refused beside their field", () => {
  it("refuses a control character in the asset number and the nozzle set, and a lone surrogate in the name", () => {
    const typed = {
      code: "AW-1",
      assetNumber: "WX\u00070001",
      name: "Washer \ud800",
      kind: "multi_tank_aqueous",
      description: "",
      stages: [
        {
          id: null,
          name: "Spray wash",
          kind: "wash",
          capabilities: ["spray"],
          tankVolumeL: "",
          sprayPressureBar: "3",
          nozzleSet: "NS\u0000-1",
        },
      ],
    };
    const issues = createSystemSchema.safeParse(typed).error?.issues ?? [];
    expect(issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["assetNumber", TEXT_CONTROL_MESSAGE],
      ["name", TEXT_SURROGATE_MESSAGE],
      ["stages.0.nozzleSet", TEXT_CONTROL_MESSAGE],
    ]);
  });
});
