import {
  diffRecipes,
  IMPACT_ORDER,
  maxImpact,
  type Impact,
  type RecipeDiff,
  type RecipeSnapshot,
} from "./diff";
import {
  parameterTriggers,
  requiredTests,
  triggersOf,
  type ImpactTrigger,
  type MatrixRow,
  type RequiredTest,
} from "./requalification";
import { mergeTests, type SubjectAssessment } from "./subjects";

export interface Assessment {
  diff: RecipeDiff;
  computed: Impact;
  /** The class that holds: the computed one, or higher where the engineer raised it. */
  impact: Impact;
  triggers: ImpactTrigger[];
  tests: RequiredTest[];
}

/**
 * The computed impact with its working. A new part family on a recipe is a new
 * application of the process, a revalidation trigger (GHTF/SG3/N99-10 §6.4),
 * so it is major whatever the parameters do. Only a major change calls for
 * requalification tests; a minor one needs approval only.
 */
export function assess(input: {
  from: RecipeSnapshot;
  to: RecipeSnapshot;
  newPartFamily: string | null;
  /** A new recipe's first validation: the part family is its first application, not an added one. */
  initial?: boolean;
  raisedTo: Impact | null;
  matrix: MatrixRow[];
  /** What the change request changes besides the recipe (equipment, a specification). */
  subject?: SubjectAssessment | null;
}): Assessment {
  const diff = diffRecipes(input.from, input.to);
  const extra: ImpactTrigger[] = input.newPartFamily
    ? [
        {
          subject: "part_family",
          reason: input.initial
            ? `Initial validation of the recipe for ${input.newPartFamily}.`
            : `New part family on the recipe: ${input.newPartFamily}.`,
        },
      ]
    : [];
  const subject = input.subject ?? null;
  if (subject) extra.push(...subject.triggers);
  const computed = maxImpact(
    diff.impact,
    extra.length ? "major" : "editorial",
    subject?.impact ?? "editorial",
  );
  const impact = maxImpact(computed, input.raisedTo ?? "editorial");
  const triggers = impact === "major" ? triggersOf(diff, extra) : [];
  // Raised to major by judgement with no major row: every changed parameter calls up its tests.
  if (impact === "major" && triggers.length === 0) {
    for (const p of diff.parameters.filter((r) => r.change !== "unchanged")) {
      triggers.push(
        ...parameterTriggers(p, `${p.stage} · ${p.name}: raised to major by the engineer.`),
      );
    }
  }
  return {
    diff,
    computed,
    impact,
    triggers,
    tests:
      impact === "major"
        ? mergeTests(requiredTests(triggers, input.matrix), subject?.tests ?? [])
        : [],
  };
}

/** The engineer may raise the class, never lower it. */
export function raiseProblem(computed: Impact, raisedTo: Impact | null): string | null {
  if (raisedTo && IMPACT_ORDER.indexOf(raisedTo) < IMPACT_ORDER.indexOf(computed)) {
    return `The computed class is ${computed}; it may be raised, never lowered to ${raisedTo}.`;
  }
  return null;
}
