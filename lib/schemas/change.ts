import { z } from "zod";
import "./messages";
import { storedText } from "@/lib/schemas/text";
import {
  CHANGE_KINDS,
  IMPACT_CLASSES,
  PARAMETER_KINDS,
  STAGE_KINDS,
  STAGE_MODES,
  TEST_TYPES,
} from "@/db/enums";
import { DEFAULT_MIN_CYCLES } from "@/lib/changes/requalification";
import { MATRIX_SUBJECTS } from "@/lib/recipes/test-types";
import { parameterProblems } from "@/lib/recipes/units";

/** Numbers arrive as the text the user typed; an empty optional bound means "no bound". */
const requiredNumber = z.preprocess(
  (v) => (typeof v === "string" ? (v.trim() === "" ? undefined : Number(v.replace(",", "."))) : v),
  z.number({ error: "Enter a number." }).finite("Enter a number."),
);
const optionalNumber = z.preprocess(
  (v) =>
    typeof v === "string" ? (v.trim() === "" ? null : Number(v.replace(",", "."))) : (v ?? null),
  z
    .number({ error: "Enter a number or leave empty." })
    .finite("Enter a number or leave empty.")
    .nullable(),
);

export const parameterSchema = z.object({
  key: z
    .string()
    .trim()
    .regex(
      /^[a-z][a-z0-9_]*\.[a-z0-9_.]+$/,
      "Use a key like wash.temperature (lower case, stage.parameter).",
    ),
  name: storedText().trim().min(2, "Name the parameter.").max(120),
  kind: z.enum(PARAMETER_KINDS, { error: "Choose the kind of parameter." }),
  setpoint: requiredNumber,
  unit: storedText().trim().min(1, "Give the unit.").max(20),
  validatedLow: optionalNumber,
  validatedHigh: optionalNumber,
  critical: z.boolean(),
});

export const stageSchema = z.object({
  name: storedText().trim().min(2, "Name the stage.").max(120),
  kind: z.enum(STAGE_KINDS, { error: "Choose the kind of stage." }),
  mode: z.enum(STAGE_MODES).nullable(),
  parameters: z.array(parameterSchema).max(40),
});

export const recipeContentSchema = z
  .object({
    detergent: storedText()
      .trim()
      .max(200)
      .transform((v) => v || null),
    notes: storedText()
      .trim()
      .max(2000)
      .transform((v) => v || null),
    stages: z.array(stageSchema).min(1, "A recipe has at least one stage.").max(12),
  })
  .superRefine((recipe, ctx) => {
    const seen = new Set<string>();
    recipe.stages.forEach((stage, i) =>
      stage.parameters.forEach((p, j) => {
        const path = ["stages", i, "parameters", j];
        if (seen.has(p.key))
          ctx.addIssue({
            code: "custom",
            path: [...path, "key"],
            message: `The key ${p.key} is used twice.`,
          });
        seen.add(p.key);
        for (const problem of parameterProblems({ ...p, stageKind: stage.kind })) {
          ctx.addIssue({
            code: "custom",
            path: [...path, problem.field],
            message: problem.message,
          });
        }
      }),
    );
  });
export type RecipeContent = z.output<typeof recipeContentSchema>;

/** What the engineer edits on a draft change request; the payload is the editor's JSON. */
export const proposalSchema = z
  .object({
    changeRequestId: z.string().uuid(),
    /** The proposal's save counter when the editor loaded it. */
    lockVersion: z.number().int().min(0),
    title: storedText().trim().min(5, "Give the change a title of at least 5 characters.").max(200),
    kind: z.enum(CHANGE_KINDS, { error: "Choose what kind of change this is." }),
    partFamilyId: z
      .string()
      .optional()
      .transform((v) => v || null)
      .pipe(z.string().uuid().nullable()),
    raiseTo: z
      .string()
      .optional()
      .transform((v) => v || null)
      .pipe(z.enum(IMPACT_CLASSES).nullable()),
    raiseReason: storedText()
      .trim()
      .max(2000)
      .transform((v) => v || null),
    recipe: recipeContentSchema,
  })
  .superRefine((v, ctx) => {
    if (v.raiseTo && !v.raiseReason)
      ctx.addIssue({
        code: "custom",
        path: ["raiseReason"],
        message: "Give the reason for raising the classification.",
      });
    if (v.kind === "new_part_family" && !v.partFamilyId)
      ctx.addIssue({
        code: "custom",
        path: ["partFamilyId"],
        message: "Choose the part family the change adds.",
      });
    if (v.kind === "initial_validation" && !v.partFamilyId)
      ctx.addIssue({
        code: "custom",
        path: ["partFamilyId"],
        message: "Choose the part family the recipe is validated for.",
      });
  });
export type Proposal = z.output<typeof proposalSchema>;

export const openChangeSchema = z.object({
  recipeId: z.string().uuid(),
  title: storedText().trim().min(5, "Give the change a title of at least 5 characters.").max(200),
  kind: z
    .enum(CHANGE_KINDS, { error: "Choose what kind of change this is." })
    .refine(
      (k) => k !== "initial_validation",
      "A new recipe's first version is routed from its draft: use Route for initial validation.",
    )
    .refine(
      (k) => k !== "equipment",
      "An equipment change is opened by saving the new equipment in the washer's editor.",
    )
    .refine(
      (k) => k !== "specification",
      "A specification change is opened from the revised specification's page.",
    ),
});

/** Routing a new recipe's draft first version through its initial validation. */
export const openInitialValidationSchema = z.object({
  recipeId: z.string().uuid(),
  title: storedText()
    .trim()
    .min(5, "Give the validation a title of at least 5 characters.")
    .max(200),
  partFamilyId: z.string().uuid("Choose the part family the recipe is validated for."),
});
export type OpenInitialValidation = z.output<typeof openInitialValidationSchema>;

export const changeIdSchema = z.object({ changeRequestId: z.string().uuid() });

export const signedStepSchema = changeIdSchema.extend({
  password: z.string().min(1, "Enter your password to sign."),
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
});

export const endChangeSchema = changeIdSchema.extend({
  reason: storedText()
    .trim()
    .min(5, "Give the reason for the record (at least 5 characters).")
    .max(2000),
});

export const linkEvidenceSchema = z.object({
  changeRequestId: z.string().uuid(),
  requirementId: z.string().uuid(),
  testRunId: z.string().uuid({ error: "Choose a test run." }),
});

export const matrixRowSchema = z.object({
  subject: z.enum(MATRIX_SUBJECTS),
  testType: z.enum(TEST_TYPES),
  confidencePct: z.coerce
    .number({ error: "Enter a percentage." })
    .gt(50, "Confidence above 50 %.")
    .lt(100, "Confidence below 100 %."),
  reliabilityPct: z.coerce
    .number({ error: "Enter a percentage." })
    .gt(50, "Reliability above 50 %.")
    .lt(100, "Reliability below 100 %."),
  // Parts from one basket share its wash: independent samples come from distinct cycles [practice].
  minCycles: z.coerce
    .number({ error: "Enter a whole number of cycles." })
    .int("Enter a whole number of cycles.")
    .min(1, "At least 1 cycle.")
    .max(100, "At most 100 cycles.")
    .default(DEFAULT_MIN_CYCLES),
});

export const matrixSchema = z
  .object({
    note: storedText().trim().min(5, "Say what changed and why (at least 5 characters).").max(1000),
    rows: z.array(matrixRowSchema).min(1, "Keep at least one row."),
  })
  .superRefine((m, ctx) => {
    const seen = new Set<string>();
    m.rows.forEach((r, i) => {
      const k = `${r.subject}|${r.testType}`;
      if (seen.has(k))
        ctx.addIssue({
          code: "custom",
          path: ["rows", i, "testType"],
          message: "This subject already maps to this test.",
        });
      seen.add(k);
    });
  });

export const intervalSchema = z.object({
  intervalId: z.string().uuid(),
  intervalMonths: z.coerce
    .number({ error: "Enter a number of months." })
    .int("Enter whole months.")
    .min(1, "At least 1 month.")
    .max(60, "At most 60 months."),
  reason: storedText()
    .trim()
    .min(5, "Give the reason for the record (at least 5 characters).")
    .max(1000),
});
