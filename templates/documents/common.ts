import { b, h, p, table, ul, type RichNode } from "@/lib/documents/rich-text";
import type { TemplateContext } from "./context";

const fmt = (n: number) => new Intl.NumberFormat("en-GB", { maximumFractionDigits: 3 }).format(n);
const range = (low: number | null, high: number | null, unit: string) =>
  low === null && high === null
    ? "not set"
    : low === null
      ? `≤ ${fmt(high!)} ${unit}`
      : high === null
        ? `≥ ${fmt(low)} ${unit}`
        : `${fmt(low)}–${fmt(high)} ${unit}`;

export function scopeFacts(ctx: TemplateContext): RichNode[] {
  return [
    ul(
      ctx.system
        ? `Cleaning system: ${ctx.system.code} — ${ctx.system.name}.`
        : "Cleaning system: [name the washer and its location].",
      ctx.partFamily
        ? `Part family: ${ctx.partFamily.code} — ${ctx.partFamily.name}, ${ctx.partFamily.material}, wetted area ${fmt(ctx.partFamily.wettedAreaCm2)} cm².`
        : "Part family: [name the parts, material and wetted area in cm²].",
      ctx.recipe
        ? `Recipe: ${ctx.recipe.code} version ${ctx.recipe.version} — ${ctx.recipe.name}.`
        : "Recipe: [name the recipe and the version this document covers].",
    ),
  ];
}

export function responsibilities(): RichNode[] {
  return [
    h(2, "Responsibilities"),
    table(
      ["Role", "Responsibility"],
      [
        [
          "Process quality engineer",
          "Writes this document, organises the runs, evaluates the results and writes the report.",
        ],
        [
          "Production engineering",
          "Provides the washer in the stated condition and operates it to the recipe.",
        ],
        [
          "Cleanliness laboratory",
          "Extracts, filters and analyses the samples and records the raw data.",
        ],
        ["Reviewers", "Check that the document is complete, correct and can be executed."],
        [
          "Quality manager (approver)",
          "Approves the document before execution and the report after it.",
        ],
      ],
    ),
  ];
}

export function recipeTable(ctx: TemplateContext): RichNode[] {
  if (!ctx.recipe || ctx.recipe.parameters.length === 0) {
    return [
      p(
        "List each recipe parameter with its setpoint, unit and validated range, or link the recipe version above.",
      ),
    ];
  }
  return [
    p(
      `Parameters of ${ctx.recipe.code} version ${ctx.recipe.version} as released in Washproof at the time of writing:`,
    ),
    table(
      ["Parameter", "Setpoint", "Validated range"],
      ctx.recipe.parameters.map((x) => [
        x.name,
        `${fmt(x.setpoint)} ${x.unit}`,
        range(x.low, x.high, x.unit),
      ]),
    ),
  ];
}

export function acceptanceCriteria(ctx: TemplateContext): RichNode[] {
  const s = ctx.partFamily?.spec;
  const rows: string[][] = s
    ? [
        ["Particle cleanliness (ISO 16232)", `Within ${s.ccc} (specification ${s.code})`],
        [
          "Largest metallic particle",
          s.maxMetallicUm === null ? "not specified" : `≤ ${fmt(s.maxMetallicUm)} µm`,
        ],
        [
          "Largest non-metallic particle",
          s.maxNonMetallicUm === null ? "not specified" : `≤ ${fmt(s.maxNonMetallicUm)} µm`,
        ],
        ["Largest fibre", s.maxFibreUm === null ? "not specified" : `≤ ${fmt(s.maxFibreUm)} µm`],
        [
          "Residue mass (gravimetry)",
          s.gravimetricLimitMg === null
            ? "not specified"
            : `≤ ${fmt(s.gravimetricLimitMg)} mg ${s.gravimetricBasis === "per_1000_cm2" ? "per 1000 cm²" : "per component"}`,
        ],
        [
          "Wetting tension",
          s.minWettingTensionMNm === null
            ? "not specified"
            : `≥ ${fmt(s.minWettingTensionMNm)} mN/m`,
        ],
        ["Visual", s.visualCriteria ?? "not specified"],
        ["Dryness", s.drynessCriteria ?? "not specified"],
      ]
    : [["[Characteristic]", "[Limit with its unit, from the customer specification]"]];
  return [
    h(2, "Acceptance criteria"),
    p(
      "Every sample must meet every criterion below. The limits come from the customer's specification; where this table and the specification differ, the specification governs.",
    ),
    table(["Characteristic", "Limit"], rows),
    p(
      "A computed pass or fail supports, and does not replace, the customer's specification and the responsible engineer's judgement.",
    ),
  ];
}

export function samplePlan(ctx: TemplateContext, what: string): RichNode[] {
  const { confidencePct, reliabilityPct, size } = ctx.sample;
  return [
    h(2, "Sample plan"),
    p(
      `Sample size by the success-run theorem (zero failures allowed): n = ln(1 − C) / ln(R), rounded up. With confidence C = ${fmt(confidencePct)} % and reliability R = ${fmt(reliabilityPct)} %, `,
      b(`n = ${size} ${what}`),
      ". One failing sample fails the run; it is handled as a deviation, never by testing more samples until enough pass.",
    ),
  ];
}

export function testMethods(): RichNode[] {
  return [
    h(2, "Test methods"),
    table(
      ["Test", "Method in brief", "Reported as"],
      [
        [
          "Particle extraction and analysis",
          "Extract by pressure rinsing (or ultrasonics, as qualified) into a clean filter; qualify the extraction by the declining test and measure a blank value before the series (ISO 16232). Count and size particles by microscope; classify metallic lustre.",
          "Count per size class per 1000 cm², cleanliness code, largest particles in µm",
        ],
        [
          "Gravimetry",
          "Dry and weigh the analysis filter before and after filtration on a balance with 0.1 mg resolution. Weigh a blank the same way: it qualifies the result when it is at most 10 % of the residue and is never subtracted. A residue below the method's practical lower limit (about 1 mg) is not qualified: pool more parts.",
          "Residue mass in mg",
        ],
        [
          "Wetting tension",
          "Apply test inks of rising surface tension; the result is the highest ink that wets the surface for about 2 s (ASTM D2578 practice).",
          "mN/m, to the nearest 0.5 mN/m",
        ],
        [
          "Rinse-water conductivity",
          "Read the final-rinse conductivity at the tank with a calibrated, temperature-compensated meter.",
          "µS/cm at 25 °C",
        ],
        [
          "Visual and dryness",
          "Inspect under bench lighting at 2× magnification within 5 min of unloading; check bores for standing water.",
          "Pass / fail with a description",
        ],
        [
          "UV inspection for oil films",
          "Inspect under a UV-A lamp in a darkened booth for fluorescent oil residues; wear UV-blocking glasses and never look into the lamp.",
          "Pass / fail with photo reference",
        ],
      ],
    ),
  ];
}

export function safetyNote(): RichNode[] {
  return [
    h(2, "Safety"),
    p(
      "Caution: the wash and rinse baths run hot and the detergent is alkaline; parts leave the vacuum dryer hot; the ultrasonic tank is loud; filter changes need the machine isolated. Follow the site's safety data sheets, local codes and licensed practice; this document does not replace them.",
    ),
  ];
}

export function deviations(): RichNode[] {
  return [
    h(2, "Deviation handling"),
    ul(
      "Record any departure from this document, any failed sample and any equipment fault as a deviation at the time it happens, with date, time and who found it.",
      "Do not repeat or discard a sample to obtain a pass. Assess the impact, find the cause and decide with the approver whether the run continues, is repeated or fails.",
      "Where the cause lies in the process, open a CAPA and, if a recipe parameter must change, a change request.",
    ),
  ];
}

export function approvals(): RichNode[] {
  return [
    h(2, "Approvals"),
    p(
      "This document is signed electronically in Washproof. Each signature shows the printed name, the meaning (authored, reviewed, approved), the date and time in UTC, and the content hash of exactly the version signed.",
    ),
  ];
}
