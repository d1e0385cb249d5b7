import { z } from "zod";
import { CleanlinessSpecError, parseCleanlinessSpec } from "@/lib/cleanliness";
import { checkbox, optionalNumber, optionalText, optionalUuid, requiredText, uuid } from "./fields";

/** The cleanliness code as typed; a parse error names the character where it goes wrong. */
const ccc = requiredText("the cleanliness-code specification", 3, 200).superRefine((text, ctx) => {
  try {
    parseCleanlinessSpec(text);
  } catch (error) {
    ctx.addIssue({
      code: "custom",
      message:
        error instanceof CleanlinessSpecError
          ? error.message
          : "Not a cleanliness-code specification.",
    });
  }
});

/**
 * One revision of a customer's cleanliness specification. Largest-particle limits up to 10 mm and
 * a gravimetric limit up to 10 g are generous bounds for typing errors [practice]; wetting
 * tension test inks span about 18–105 mN/m [memory, ISO 8296 ink series].
 */
const limits = {
  name: requiredText("a short title", 2, 120),
  customer: requiredText("the customer", 2, 120),
  documentNumber: requiredText("the customer's document number", 1, 60),
  revision: requiredText("the revision", 1, 20),
  sourceFileId: optionalUuid("the uploaded source document"),
  partFamilyIds: z.preprocess(
    (v) => (v === undefined || v === "" ? [] : Array.isArray(v) ? v : [v]),
    z.array(uuid("a part family")).max(200),
  ),
  ccc,
  maxMetallicUm: optionalNumber("Largest metallic particle", "µm", { above: 0, max: 10_000 }),
  maxNonMetallicUm: optionalNumber("Largest non-metallic particle", "µm", {
    above: 0,
    max: 10_000,
  }),
  maxFibreUm: optionalNumber("Largest fibre", "µm", { above: 0, max: 50_000 }),
  gravimetricLimitMg: optionalNumber("Gravimetric limit", "mg", { min: 0, max: 10_000 }),
  gravimetricBasis: z.preprocess(
    (v) => (v === "" || v === undefined ? null : v),
    z
      .enum(["per_component", "per_1000_cm2"], { error: "Choose per part or per 1000 cm²." })
      .nullable(),
  ),
  minWettingTensionMNm: optionalNumber("Minimum wetting tension", "mN/m", { min: 18, max: 105 }),
  visualCriteria: optionalText(1000),
  drynessCriteria: optionalText(1000),
  extraRequirements: optionalText(4000),
  customerApprovesChanges: checkbox,
};

const gravimetricNeedsBasis = (v: {
  gravimetricLimitMg: number | null;
  gravimetricBasis: string | null;
}) => v.gravimetricLimitMg === null || v.gravimetricBasis !== null;
const basisRule = {
  path: ["gravimetricBasis"],
  message: "Say whether the gravimetric limit is per part or per 1000 cm².",
};

/** A new specification in the register; `code` names it across its revisions. */
export const specSchema = z
  .object({
    code: requiredText("the register code", 2, 40).pipe(
      z
        .string()
        .regex(
          /^[A-Za-z0-9][A-Za-z0-9._\/-]*$/,
          "Use letters, digits and . _ / - in the code, no spaces.",
        ),
    ),
    ...limits,
  })
  .refine(gravimetricNeedsBasis, basisRule);
export type SpecInput = z.output<typeof specSchema>;

/** A new revision of the specification in force; it supersedes that one. */
export const reviseSpecSchema = z
  .object({
    specId: uuid("the specification"),
    reason: requiredText("why the specification is revised", 5, 1000),
    ...limits,
  })
  .refine(gravimetricNeedsBasis, basisRule);
export type ReviseSpecInput = z.output<typeof reviseSpecSchema>;

/** One click from a revised specification: the change request it calls for on one qualified recipe. */
export const openSpecChangeSchema = z.object({
  specId: uuid("the specification"),
  recipeId: uuid("the recipe"),
});
