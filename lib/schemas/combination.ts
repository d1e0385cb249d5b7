import { z } from "zod";
import { requiredNumber, requiredText, uuid } from "./fields";

/** Records that a recipe version is validated for a part family, and what proves it. */
export const qualifyCombinationSchema = z.object({
  recipeVersionId: uuid("the recipe version"),
  partFamilyId: uuid("the part family"),
  basis: requiredText(
    "what proves the qualification (report, change request or run numbers)",
    5,
    1000,
  ),
  qualifiedOn: requiredText("the qualification date", 10, 10).pipe(
    z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Enter the date as YYYY-MM-DD."),
  ),
  // Periodic requalification: a year is a common interval [practice]; five years is a generous ceiling.
  intervalMonths: requiredNumber("Requalification interval", "months", {
    int: true,
    min: 1,
    max: 60,
  }),
});
export type QualifyCombinationInput = z.output<typeof qualifyCombinationSchema>;
