import { doc, h, ol, p, table, ul, type RichDoc, type RichNode } from "@/lib/documents/rich-text";
import { humanize } from "@/lib/format/labels";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";
import {
  acceptanceCriteria,
  approvals,
  deviations,
  recipeTable,
  responsibilities,
  safetyNote,
  samplePlan,
  scopeFacts,
  testMethods,
} from "./common";
import type { TemplateContext } from "./context";

export type { TemplateContext } from "./context";

function heading(ctx: TemplateContext) {
  // A report records what was done and found; only a protocol or procedure is read before the work.
  const lead =
    ctx.type === "report"
      ? `${TYPE_LABELS[ctx.type]}. It records the runs performed, their results against the acceptance criteria, and the conclusion.`
      : ctx.type === "change_narrative"
        ? `${TYPE_LABELS[ctx.type]}.`
        : `${TYPE_LABELS[ctx.type]}. Read the whole document before the first run.`;
  return [h(1, `${ctx.number} — ${ctx.title}`), p(lead)];
}

const OUTCOME_WORDS = {
  pass: "Pass",
  fail: "Fail",
  incomplete: "Incomplete",
} as const;

/** The report's results: one row per linked run, as computed from its raw data. */
function resultsTable(ctx: TemplateContext): RichNode {
  const runs = ctx.runs ?? [];
  if (runs.length === 0)
    return table(
      ["Test", "Run", "Samples", "Computed outcome", "Criterion met"],
      [["No test run recorded yet on this part family and recipe version", "", "", "", ""]],
    );
  return table(
    ["Test", "Run", "Samples", "Computed outcome", "Criterion met"],
    runs.map((r) => [
      humanize(r.testType),
      `${r.number} (${r.status}${r.performedOn ? `, ${r.performedOn}` : ""}${r.technician ? `, ${r.technician}` : ""})`,
      String(r.samples),
      r.outcome ? OUTCOME_WORDS[r.outcome] : "Not computed",
      r.outcome === "pass" ? "Yes" : r.outcome === "fail" ? "No" : "Not yet",
    ]),
  );
}

function iqProtocol(ctx: TemplateContext): RichDoc {
  return doc(
    ...heading(ctx),
    h(2, "Purpose"),
    p(
      "Show, with documented checks, that the cleaning system is installed as specified and is connected to the utilities it needs, before its operation is qualified.",
    ),
    h(2, "Scope"),
    ...scopeFacts(ctx),
    ...responsibilities(),
    h(2, "Cleaning system and equipment"),
    ctx.system
      ? ul(
          ...ctx.system.stages.map(
            (s) =>
              `${s}: nameplate, tank volume in L, heaters, pumps, filters and ultrasonic generators as delivered.`,
          ),
        )
      : p("List every stage (tank or chamber step) with its equipment."),
    h(2, "Installation checks"),
    table(
      ["Check", "Expected", "Found", "Initials"],
      [
        ["Utilities: electrical supply", "As the manufacturer's installation drawing", "", ""],
        ["Utilities: compressed air, in bar", "As drawing", "", ""],
        [
          "Deionised water supply to the final rinse, in µS/cm at 25 °C",
          "≤ the value in the water specification",
          "",
          "",
        ],
        ["Exhaust and vapour extraction", "Connected and running", "", ""],
        [
          "Temperature, conductivity and pressure instruments",
          "Calibrated, certificates on file",
          "",
          "",
        ],
        ["Filters and their housings", "Fitted, type as specified", "", ""],
        [
          "Safety devices: lid interlocks, emergency stop, over-temperature cut-outs",
          "Present and working",
          "",
          "",
        ],
        ["Manuals, drawings and spare-parts list", "On file", "", ""],
      ],
    ),
    ...safetyNote(),
    ...deviations(),
    ...approvals(),
  );
}

function oqProtocol(ctx: TemplateContext): RichDoc {
  return doc(
    ...heading(ctx),
    h(2, "Purpose"),
    p(
      "Show that the cleaning system holds each recipe parameter inside its validated range across the range, including the limits, when run without production parts or with test loads.",
    ),
    h(2, "Scope"),
    ...scopeFacts(ctx),
    ...responsibilities(),
    h(2, "Recipe reference"),
    ...recipeTable(ctx),
    h(2, "Operational tests"),
    ol(
      "Bath temperature: run the wash and rinse tanks at the low and high ends of the validated range; log the temperature in °C every minute for 30 min.",
      "Ultrasonic power and frequency: measure at the generator and check the tank with a foil or cavitation meter at the marked positions.",
      "Spray pressure and flow: read the pressure in bar at the manifold at each nozzle bank; check no nozzle is blocked.",
      "Final-rinse conductivity: confirm the limit alarm trips above the set limit in µS/cm.",
      "Drying: log air temperature in °C or chamber pressure in mbar through a full cycle.",
      "Alarms and interlocks: provoke each alarm the recipe relies on and record the response.",
    ),
    ...acceptanceCriteria(ctx),
    ...testMethods(),
    ...safetyNote(),
    ...deviations(),
    ...approvals(),
  );
}

function pqProtocol(ctx: TemplateContext): RichDoc {
  return doc(
    ...heading(ctx),
    h(2, "Purpose"),
    p(
      "Show that the released recipe, run by the production crew on production parts at the worst-case load, consistently leaves parts that meet the cleanliness specification.",
    ),
    h(2, "Scope"),
    ...scopeFacts(ctx),
    ...responsibilities(),
    h(2, "Recipe reference"),
    ...recipeTable(ctx),
    h(2, "Worst-case load"),
    p(
      "The worst case is the load with the greatest chance of failure: a full basket at the maximum parts count, parts as dirty as production delivers them (longest time since machining), and samples taken from the basket positions that clean least well (centre of the basket, lowest layer, bores facing away from the spray).",
    ),
    ...samplePlan(ctx, "parts, taken over at least three runs on different shifts"),
    ...acceptanceCriteria(ctx),
    ...testMethods(),
    ...safetyNote(),
    ...deviations(),
    ...approvals(),
  );
}

function validationReport(ctx: TemplateContext): RichDoc {
  return doc(
    ...heading(ctx),
    h(2, "Purpose"),
    p(
      "This report gives the results of the executed protocol, states whether the acceptance criteria were met and concludes on the validated state of the process.",
    ),
    h(2, "Scope"),
    ...scopeFacts(ctx),
    h(2, "Protocol and execution"),
    p(
      (ctx.runs ?? []).length > 0
        ? `Runs performed: ${ctx.runs!.map((r) => r.number).join(", ")}. Name the protocol number and version they executed.`
        : "Name the protocol number and version executed, the dates of the runs and who performed them.",
    ),
    h(2, "Results"),
    p(
      "Computed from each run's stored raw data; a run still open or not yet verified is shown as it stands today.",
    ),
    resultsTable(ctx),
    ...acceptanceCriteria(ctx),
    h(2, "Deviations"),
    p("List each deviation raised during execution with its assessment and closure."),
    h(2, "Conclusion"),
    p(
      "State whether the process is validated for the part family and recipe above, and any conditions (for example a requalification interval).",
    ),
    ...approvals(),
  );
}

function procedure(ctx: TemplateContext): RichDoc {
  return doc(
    ...heading(ctx),
    h(2, "Purpose"),
    p("Say what this procedure achieves and for whom."),
    h(2, "Scope"),
    ...scopeFacts(ctx),
    ...responsibilities(),
    h(2, "Steps"),
    ol("First step.", "Second step.", "Record the result."),
    ...safetyNote(),
    ...approvals(),
  );
}

function changeNarrative(ctx: TemplateContext): RichDoc {
  return doc(
    ...heading(ctx),
    h(2, "What changes and why"),
    p("Describe the change and the reason for it."),
    h(2, "Impact"),
    p("Describe the impact on the validated state."),
    ...approvals(),
  );
}

const TEMPLATES: Record<TemplateContext["type"], (ctx: TemplateContext) => RichDoc> = {
  iq_protocol: iqProtocol,
  oq_protocol: oqProtocol,
  pq_protocol: pqProtocol,
  report: validationReport,
  procedure,
  change_narrative: changeNarrative,
};

/** The starting text of a new document of this type, filled in from its linked records. */
export function buildTemplate(ctx: TemplateContext): RichDoc {
  return TEMPLATES[ctx.type](ctx);
}
