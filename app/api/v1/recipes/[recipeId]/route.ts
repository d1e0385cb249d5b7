import { z } from "zod";
import { getRecipeApi } from "@/lib/server/api/queries";
import { apiRoute, notFound, ok } from "@/lib/server/api/handler";

export const GET = apiRoute<{ recipeId: string }>(
  { permission: "systems.view", scope: "read" },
  async ({ params }) => {
    const recipe = z.uuid().safeParse(params.recipeId).success
      ? await getRecipeApi(params.recipeId)
      : undefined;
    return recipe ? ok(recipe) : notFound("recipe");
  },
);
