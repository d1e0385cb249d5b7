"use server";

import { defineAction } from "@/lib/actions/define-action";
import { createRecipeSchema } from "@/lib/schemas/recipe";
import { createRecipe } from "@/lib/server/plant/create-recipe";

/** A new recipe and its draft first version; it becomes usable only through its initial validation. */
export const createRecipeAction = defineAction({
  permission: "recipe.edit",
  input: createRecipeSchema,
  from: "payload",
  invalidMessage:
    "Some values need attention. Nothing was saved; everything you typed is still here.",
  run: async ({ user, input }) => {
    const { recipe } = await createRecipe(user, input);
    return { redirect: `/systems/recipes/${recipe.id}`, id: recipe.id };
  },
  revalidate: (input) => ["/systems", `/systems/${input.systemId}`],
});
