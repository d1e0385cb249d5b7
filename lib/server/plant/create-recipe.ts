// Not "server-only": the demo seed may call `createRecipeIn` under tsx.
import { asc, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { writeRecipeContent } from "@/db/recipe-content";
import { cleaningSystems, recipes, recipeVersions, systemStages } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { recipeModeProblems } from "@/lib/plant/equipment";
import type { CreateRecipeInput } from "@/lib/schemas/recipe";
import { UserFacingError } from "@/lib/server/errors";

/**
 * A new recipe and its first version, as a draft. A first version has no effective version to be
 * compared with: it becomes effective only through its initial validation, never by an edit.
 */
export async function createRecipeIn(tx: Tx, actor: AuditActor, input: CreateRecipeInput) {
  const [system] = await tx
    .select()
    .from(cleaningSystems)
    .where(eq(cleaningSystems.id, input.systemId));
  if (!system) throw new UserFacingError("Choose the cleaning system from the list.", "systemId");
  if (!system.active)
    throw new UserFacingError(
      `${system.code} is retired: recipes are written for systems in use.`,
      "systemId",
    );
  const [clash] = await tx
    .select({ id: recipes.id })
    .from(recipes)
    .where(eq(recipes.code, input.code));
  if (clash)
    throw new UserFacingError(`A recipe with the code ${input.code} already exists.`, "code");
  const stages = await tx
    .select()
    .from(systemStages)
    .where(eq(systemStages.systemId, system.id))
    .orderBy(asc(systemStages.position));
  const [problem] = recipeModeProblems(input.content.stages, stages, system.code);
  if (problem) throw new UserFacingError(problem.message, `content.stages.${problem.index}.mode`);

  const [recipe] = await tx
    .insert(recipes)
    .values({
      systemId: system.id,
      code: input.code,
      name: input.name,
      description: input.description,
    })
    .returning();
  const [version] = await tx
    .insert(recipeVersions)
    .values({ recipeId: recipe.id, version: 1, status: "draft", createdBy: actor.id })
    .returning();
  await writeRecipeContent(tx, version.id, input.content);
  await appendAudit(tx, actor, {
    eventType: "recipe.created",
    recordType: "recipe",
    recordId: recipe.id,
    new: {
      code: input.code,
      name: input.name,
      system: system.code,
      description: input.description,
    },
  });
  await appendAudit(tx, actor, {
    eventType: "recipe_version.created",
    recordType: "recipe_version",
    recordId: version.id,
    new: { recipe: input.code, version: 1, status: "draft", content: input.content },
  });
  return { recipe, version };
}

export async function createRecipe(actor: AuditActor, input: CreateRecipeInput) {
  return getDb().transaction((tx) => createRecipeIn(tx, actor, input));
}
