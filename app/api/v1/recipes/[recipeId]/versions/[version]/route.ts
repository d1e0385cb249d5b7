import { z } from "zod";
import { getRecipeVersionApi } from "@/lib/server/api/queries";
import { apiRoute, notFound, ok } from "@/lib/server/api/handler";

const params = z.object({ recipeId: z.uuid(), version: z.coerce.number().int().positive() });

export const GET = apiRoute<{ recipeId: string; version: string }>(
  { permission: "systems.view", scope: "read" },
  async ({ params: raw }) => {
    const p = params.safeParse(raw);
    const version = p.success
      ? await getRecipeVersionApi(p.data.recipeId, p.data.version)
      : undefined;
    return version ? ok(version) : notFound("recipe version");
  },
);
