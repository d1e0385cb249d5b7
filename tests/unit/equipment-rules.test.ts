import { describe, expect, it } from "vitest";
import { equipmentImpact, stageProblems, type EquipmentStage } from "@/lib/plant/equipment";

const stage = (
  over: Partial<EquipmentStage> & Pick<EquipmentStage, "name" | "kind" | "capabilities">,
): EquipmentStage => ({
  tankVolumeL: null,
  filterRatingUm: null,
  ultrasonicPowerW: null,
  ultrasonicFrequencyKHz: null,
  sprayPressureBar: null,
  injectionPressureBar: null,
  nozzleSet: null,
  ...over,
});

const wash = stage({
  name: "Wash",
  kind: "wash",
  capabilities: ["ultrasonic", "spray"],
  tankVolumeL: 900,
  filterRatingUm: 25,
  ultrasonicPowerW: 9000,
  ultrasonicFrequencyKHz: 40,
  sprayPressureBar: 4,
  nozzleSet: "NS-1",
});
const rinse = stage({ name: "Rinse", kind: "rinse", capabilities: ["flood"] });
const finalRinse = stage({
  name: "DI rinse",
  kind: "final_rinse",
  capabilities: ["flood"],
  filterRatingUm: 5,
});
const dryer = stage({ name: "Dryer", kind: "drying", capabilities: ["vacuum_drying"] });
const washer = [wash, rinse, finalRinse, dryer];

describe("stages in process order with what defines each mode", () => {
  // Order wash → rinse → final rinse → drying: the product brief's description of an aqueous washer [practice].
  it("accepts wash, rinse, final rinse, drying, with 'other' stages anywhere", () => {
    expect(stageProblems(washer)).toEqual([]);
    expect(
      stageProblems([
        stage({ name: "Load", kind: "other", capabilities: ["flood"] }),
        ...washer,
        stage({ name: "Blow-off", kind: "other", capabilities: ["flood"] }),
      ]),
    ).toEqual([]);
    expect(stageProblems([wash, rinse, rinse, dryer])).toEqual([]);
  });

  it("refuses a stage before one it must follow, naming both", () => {
    expect(stageProblems([wash, dryer, finalRinse])).toEqual([
      {
        index: 2,
        field: "kind",
        message:
          "Stage 3 (DI rinse) is a final rinse after stage 2 (Dryer): stages run wash, rinse, final rinse, drying.",
      },
    ]);
    expect(stageProblems([rinse, wash]).map((p) => p.index)).toEqual([1]);
  });

  it("asks for ultrasonic power and frequency, spray and injection pressure, and a dryer kind", () => {
    const problems = stageProblems([
      stage({
        name: "W",
        kind: "wash",
        capabilities: ["ultrasonic", "injection"],
        ultrasonicPowerW: 5000,
      }),
      stage({ name: "R", kind: "rinse", capabilities: ["spray"] }),
      stage({ name: "D", kind: "drying", capabilities: ["flood"] }),
    ]);
    expect(problems.map((p) => `${p.index}:${p.field}`)).toEqual([
      "0:ultrasonicPowerW",
      "0:injectionPressureBar",
      "1:sprayPressureBar",
      "2:capabilities",
    ]);
  });
});

describe("the impact of an equipment change", () => {
  it("wording only is editorial", () => {
    expect(
      equipmentImpact(washer, [{ ...wash, name: "Tank 1 — wash" }, rinse, finalRinse, dryer])
        .impact,
    ).toBe("editorial");
    expect(equipmentImpact(washer, washer)).toEqual({ impact: "editorial", changes: [] });
  });

  it("a coarser filter rating, a new nozzle set and a removed ultrasonic mode are major", () => {
    expect(
      equipmentImpact(washer, [{ ...wash, filterRatingUm: 50 }, rinse, finalRinse, dryer]).impact,
    ).toBe("major");
    expect(
      equipmentImpact(washer, [{ ...wash, filterRatingUm: null }, rinse, finalRinse, dryer]).impact,
    ).toBe("major");
    expect(
      equipmentImpact(washer, [{ ...wash, nozzleSet: "NS-2" }, rinse, finalRinse, dryer]).impact,
    ).toBe("major");
    const noUltrasonic = equipmentImpact(washer, [
      { ...wash, capabilities: ["spray"] },
      rinse,
      finalRinse,
      dryer,
    ]);
    expect(noUltrasonic.impact).toBe("major");
    expect(noUltrasonic.changes[0].reason).toBe("ultrasonic mode removed.");
  });

  it("a finer filter, more pump pressure or a larger bath is minor; less power or another frequency is major", () => {
    expect(
      equipmentImpact(washer, [{ ...wash, filterRatingUm: 10 }, rinse, finalRinse, dryer]).impact,
    ).toBe("minor");
    expect(
      equipmentImpact(washer, [{ ...wash, sprayPressureBar: 5 }, rinse, finalRinse, dryer]).impact,
    ).toBe("minor");
    expect(
      equipmentImpact(washer, [{ ...wash, tankVolumeL: 1000 }, rinse, finalRinse, dryer]).impact,
    ).toBe("minor");
    expect(
      equipmentImpact(washer, [{ ...wash, ultrasonicPowerW: 6000 }, rinse, finalRinse, dryer])
        .impact,
    ).toBe("major");
    expect(
      equipmentImpact(washer, [{ ...wash, ultrasonicFrequencyKHz: 80 }, rinse, finalRinse, dryer])
        .impact,
    ).toBe("major");
  });

  it("a stage added or removed is major", () => {
    expect(equipmentImpact(washer, [wash, rinse, dryer]).changes).toEqual([
      {
        stage: "DI rinse",
        kind: "final_rinse",
        impact: "major",
        reason: 'Stage "DI rinse" removed.',
      },
    ]);
    expect(equipmentImpact([wash, rinse, dryer], washer).impact).toBe("major");
  });
});
