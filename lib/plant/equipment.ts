import { maxImpact, type Impact } from "@/lib/changes/diff";

/** A stage of a cleaning system as the equipment rules see it. */
export interface EquipmentStage {
  name: string;
  kind: string;
  capabilities: string[];
  tankVolumeL: number | null;
  filterRatingUm: number | null;
  ultrasonicPowerW: number | null;
  ultrasonicFrequencyKHz: number | null;
  sprayPressureBar: number | null;
  injectionPressureBar: number | null;
  nozzleSet: string | null;
}

/** Parts go in dirty and come out dry: wash, then rinse, then the final rinse, then drying. */
const PROCESS_RANK: Record<string, number> = { wash: 0, rinse: 1, final_rinse: 2, drying: 3 };
const KIND_WORDS: Record<string, string> = {
  wash: "a wash",
  rinse: "a rinse",
  final_rinse: "a final rinse",
  drying: "drying",
};

export interface StageProblem {
  index: number;
  field: keyof EquipmentStage;
  message: string;
}

/** Stages out of process order (wash, rinse, final rinse, drying; "other" anywhere), for washers and recipes alike. */
export function processOrderProblems(stages: { name: string; kind: string }[]): StageProblem[] {
  const problems: StageProblem[] = [];
  let last: { rank: number; index: number } | null = null;
  stages.forEach((s, index) => {
    const rank = PROCESS_RANK[s.kind];
    if (rank === undefined) return;
    if (last && rank < last.rank) {
      problems.push({
        index,
        field: "kind",
        message: `Stage ${index + 1} (${s.name}) is ${KIND_WORDS[s.kind]} after stage ${last.index + 1} (${stages[last.index].name}): stages run wash, rinse, final rinse, drying.`,
      });
    } else last = { rank, index };
  });
  return problems;
}

/** Each recipe stage must run a mode a stage of the same kind on its washer can run. */
export function recipeModeProblems(
  recipeStages: { name: string; kind: string; mode: string | null }[],
  systemStages: { kind: string; capabilities: string[] }[],
  systemCode: string,
): StageProblem[] {
  return recipeStages.flatMap((s, index): StageProblem[] => {
    if (s.mode === null) return [];
    const able = systemStages.some((st) => st.kind === s.kind && st.capabilities.includes(s.mode!));
    return able
      ? []
      : [
          {
            index,
            field: "capabilities",
            message: `Stage ${index + 1} (${s.name}): ${systemCode} has no ${s.kind.replace(/_/g, " ")} stage that can run ${MODE_WORDS[s.mode] ?? s.mode}.`,
          },
        ];
  });
}

/**
 * Stages in process order, and each mode with what defines it: an ultrasonic stage its power and
 * frequency, a spray or injection stage its pressure, a drying stage a dryer. "Other" stages
 * (loading, a blow-off) may stand anywhere [practice].
 */
export function stageProblems(stages: EquipmentStage[]): StageProblem[] {
  const problems: StageProblem[] = processOrderProblems(stages);
  stages.forEach((s, index) => {
    const has = (mode: string) => s.capabilities.includes(mode);
    if (has("ultrasonic") && (s.ultrasonicPowerW === null || s.ultrasonicFrequencyKHz === null)) {
      problems.push({
        index,
        field: "ultrasonicPowerW",
        message: `Stage ${index + 1} (${s.name}) runs ultrasonics: give the generator power (W) and frequency (kHz).`,
      });
    }
    if (has("spray") && s.sprayPressureBar === null)
      problems.push({
        index,
        field: "sprayPressureBar",
        message: `Stage ${index + 1} (${s.name}) sprays: give the spray pressure (bar).`,
      });
    if (has("injection") && s.injectionPressureBar === null)
      problems.push({
        index,
        field: "injectionPressureBar",
        message: `Stage ${index + 1} (${s.name}) injects: give the injection pressure (bar).`,
      });
    if (s.kind === "drying" && !has("hot_air_drying") && !has("vacuum_drying")) {
      problems.push({
        index,
        field: "capabilities",
        message: `Stage ${index + 1} (${s.name}) dries: say whether with hot air or vacuum.`,
      });
    }
  });
  return problems;
}

export interface EquipmentChange {
  stage: string;
  /** The kind of the stage changed, so a major change calls up the matrix rows for that kind of stage. */
  kind: string;
  impact: Impact;
  reason: string;
}

/** Stages are matched by kind and their order among stages of that kind, as recipe stages are. */
function keyed(stages: EquipmentStage[]) {
  const seen = new Map<string, number>();
  return stages.map((s) => {
    const n = (seen.get(s.kind) ?? 0) + 1;
    seen.set(s.kind, n);
    return { key: `${s.kind}#${n}`, s };
  });
}

const MODE_WORDS: Record<string, string> = {
  ultrasonic: "ultrasonic",
  spray: "spray",
  injection: "injection",
  flood: "flood",
  immersion: "immersion",
  hot_air_drying: "hot-air drying",
  vacuum_drying: "vacuum drying",
};

/**
 * The impact of an equipment change on the recipes validated on the system, in the terms of
 * product.md "Change impact": what can leave parts less clean than validated is major (a mode
 * removed, a coarser or removed filter, a new nozzle set, less ultrasonic power or pump pressure,
 * a stage added or removed); more of the same is minor; names and wording are editorial.
 */
export function equipmentImpact(
  before: EquipmentStage[],
  after: EquipmentStage[],
): { impact: Impact; changes: EquipmentChange[] } {
  const changes: EquipmentChange[] = [];
  let kind = "";
  const add = (stage: string, impact: Impact, reason: string) =>
    changes.push({ stage, kind, impact, reason });
  const old = keyed(before);
  const next = keyed(after);
  for (const { key, s: o } of old) {
    kind = o.kind;
    const n = next.find((x) => x.key === key)?.s;
    if (!n) {
      add(o.name, "major", `Stage "${o.name}" removed.`);
      continue;
    }
    if (n.name !== o.name) add(n.name, "editorial", `Renamed from "${o.name}".`);
    for (const mode of o.capabilities)
      if (!n.capabilities.includes(mode))
        add(n.name, "major", `${MODE_WORDS[mode] ?? mode} mode removed.`);
    for (const mode of n.capabilities)
      if (!o.capabilities.includes(mode))
        add(n.name, "major", `${MODE_WORDS[mode] ?? mode} mode added: not validated yet.`);
    if (o.filterRatingUm !== n.filterRatingUm) {
      const coarser =
        n.filterRatingUm === null ||
        (o.filterRatingUm !== null && n.filterRatingUm > o.filterRatingUm);
      add(
        n.name,
        coarser ? "major" : "minor",
        `Filter rating ${o.filterRatingUm ?? "none"} → ${n.filterRatingUm ?? "none"} µm${coarser ? ": coarser filtration leaves more particles in the bath" : ""}.`,
      );
    }
    if ((o.nozzleSet ?? "") !== (n.nozzleSet ?? ""))
      add(
        n.name,
        "major",
        `Nozzle set ${o.nozzleSet ?? "none"} → ${n.nozzleSet ?? "none"}: a new set changes how the parts are hit.`,
      );
    const less = (label: string, unit: string, a: number | null, b: number | null) => {
      if (a === b) return;
      const lower = b === null || (a !== null && b < a);
      add(n.name, lower ? "major" : "minor", `${label} ${a ?? "none"} → ${b ?? "none"} ${unit}.`);
    };
    less("Ultrasonic power", "W", o.ultrasonicPowerW, n.ultrasonicPowerW);
    less("Spray pressure", "bar", o.sprayPressureBar, n.sprayPressureBar);
    less("Injection pressure", "bar", o.injectionPressureBar, n.injectionPressureBar);
    // A different frequency cleans differently (cavitation bubble size), up or down.
    if (o.ultrasonicFrequencyKHz !== n.ultrasonicFrequencyKHz)
      add(
        n.name,
        "major",
        `Ultrasonic frequency ${o.ultrasonicFrequencyKHz ?? "none"} → ${n.ultrasonicFrequencyKHz ?? "none"} kHz.`,
      );
    if (o.tankVolumeL !== n.tankVolumeL)
      add(
        n.name,
        "minor",
        `Bath volume ${o.tankVolumeL ?? "none"} → ${n.tankVolumeL ?? "none"} L: detergent additions scale with it.`,
      );
  }
  for (const { key, s } of next) {
    kind = s.kind;
    if (!old.some((x) => x.key === key)) add(s.name, "major", `Stage "${s.name}" added.`);
  }
  return { impact: maxImpact(...changes.map((c) => c.impact)), changes };
}
