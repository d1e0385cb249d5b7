import { z } from "zod";
import { processOrderProblems } from "@/lib/plant/equipment";
import { ownRangeProblem } from "@/lib/recipes/units";
import { recipeContentSchema } from "./change";
import { optionalText, requiredText, uuid } from "./fields";

/**
 * A new recipe for a cleaning system with its first version's content. Beyond the content rules
 * every version obeys (units, physical limits), a first version has its stages in process order
 * and every setpoint inside the validated range written beside it.
 */
export const createRecipeSchema = z
  .object({
    systemId: uuid("the cleaning system"),
    code: requiredText("the recipe's code", 2, 40).pipe(
      z
        .string()
        .regex(
          /^[A-Za-z0-9][A-Za-z0-9._\/-]*$/,
          "Use letters, digits and . _ / - in the code, no spaces.",
        ),
    ),
    name: requiredText("the recipe's name", 2, 120),
    description: optionalText(1000),
    content: recipeContentSchema,
  })
  .superRefine((recipe, ctx) => {
    for (const problem of processOrderProblems(recipe.content.stages)) {
      ctx.addIssue({
        code: "custom",
        path: ["content", "stages", problem.index, "kind"],
        message: problem.message,
      });
    }
    recipe.content.stages.forEach((stage, i) =>
      stage.parameters.forEach((p, j) => {
        const problem = ownRangeProblem(p);
        if (problem)
          ctx.addIssue({
            code: "custom",
            path: ["content", "stages", i, "parameters", j, problem.field],
            message: problem.message,
          });
      }),
    );
  });
export type CreateRecipeInput = z.output<typeof createRecipeSchema>;
