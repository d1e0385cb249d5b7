import { NextResponse } from "next/server";
import { z } from "zod";
import { fileStamp } from "@/lib/format/date";
import { recipeToCsv } from "@/lib/recipes/csv";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { getRecipeVersionPage } from "@/lib/server/changes/queries";

const querySchema = z.object({
  recipeId: z.uuid(),
  version: z.coerce.number().int().min(1).max(100_000),
});

/** One version of a recipe as the recipe-parameter CSV: edit it and import it as a new recipe, or keep it as a record. */
export const GET = defineRoute<{ recipeId: string }>(
  { permission: "systems.view" },
  async ({ request, params }) => {
    const query = querySchema.safeParse({
      recipeId: params.recipeId,
      version: new URL(request.url).searchParams.get("version") ?? undefined,
    });
    if (!query.success) return routeError(400, "Ask for a recipe and version=<number>.");
    const page = await getRecipeVersionPage(query.data.recipeId, query.data.version);
    if (!page) return routeError(404, "That recipe version does not exist.");
    const name = `${page.recipe.code.replace(/[^A-Za-z0-9._-]/g, "_")}-v${page.version.version}-${fileStamp()}.csv`;
    return new NextResponse(`\uFEFF${recipeToCsv(page.content)}`, {
      headers: {
        "Content-Type": "text/csv; charset=utf-8",
        "Content-Disposition": `attachment; filename="${name}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
