import { NextResponse } from "next/server";
import { z } from "zod";
import { formatSize } from "@/lib/format/number";
import { parseMasterDataCsv, type ParameterRow } from "@/lib/plant/csv-master-data";
import { columnOf, contentFromRows } from "@/lib/recipes/csv";
import { createRecipeSchema } from "@/lib/schemas/recipe";
import { storedText } from "@/lib/schemas/text";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";
import { createRecipe } from "@/lib/server/plant/create-recipe";

const mappingSchema = z.record(z.string().max(60), storedText().max(200));
// A recipe has at most 12 stages of 40 parameters (the recipe schema's own limits).
const MAX_ROWS = 480;

type RowError = { line: number; message: string };

/**
 * A new recipe for the washer from a CSV of its stages and parameters: every row checked as the
 * recipe form checks it, then the whole recipe through the same service as the form, as a draft
 * first version. Any problem and nothing is saved; each names its line and column.
 */
export const POST = defineRoute<{ systemId: string }>(
  { permission: "recipe.edit" },
  async ({ request, user, params }) => {
    const form = await request.formData().catch(() => null);
    const file = form?.get("file");
    if (!(file instanceof File)) return routeError(400, "Choose a CSV file.");
    const limit = uploadLimitBytes();
    if (file.size > limit)
      throw new UserFacingError(
        `The file is larger than the limit of ${formatSize(limit)}. Nothing was imported.`,
        { kind: "too_large" },
      );
    let mapping: Record<string, string> | undefined;
    const mappingText = form?.get("mapping");
    if (typeof mappingText === "string" && mappingText !== "") {
      let json: unknown = null;
      try {
        json = JSON.parse(mappingText);
      } catch {
        // reported just below as an invalid mapping
      }
      const parsed = mappingSchema.safeParse(json);
      if (!parsed.success) return routeError(400, "The column mapping is not valid.");
      mapping = Object.fromEntries(Object.entries(parsed.data).filter(([, v]) => v !== ""));
    }
    const field = (name: string) => {
      const v = form?.get(name);
      return typeof v === "string" ? v : "";
    };
    const text = new TextDecoder("utf-8", { fatal: false })
      .decode(await file.arrayBuffer())
      .replace(/^\uFEFF/, "");
    const parsed = parseMasterDataCsv("recipe_parameters", text, { mapping, maxRows: MAX_ROWS });
    const refuse = (message: string, rowErrors: RowError[]) =>
      NextResponse.json(
        { ok: false, message, rowErrors: rowErrors.slice(0, 50), errorCount: rowErrors.length },
        { status: 422 },
      );
    if (parsed.fileErrors.length) return refuse(parsed.fileErrors.join(" "), []);
    if (parsed.errors.length)
      return refuse(
        `${parsed.errors.length} problem(s) in the file. Nothing was imported.`,
        parsed.errors,
      );
    const built = contentFromRows(parsed.rows as ParameterRow[], {
      detergent: field("detergent"),
      notes: field("notes"),
    });
    const input = createRecipeSchema.safeParse({
      systemId: params.systemId,
      code: field("code"),
      name: field("name"),
      description: field("description"),
      content: built.content,
    });
    if (!input.success) {
      const rowErrors: RowError[] = [];
      const formErrors: string[] = [];
      for (const issue of input.error.issues) {
        const path = issue.path.join(".");
        const line = built.lineOf(path);
        if (line === null) formErrors.push(`${path || "recipe"}: ${issue.message}`);
        else rowErrors.push({ line, message: `${columnOf(path)}: ${issue.message}` });
      }
      return refuse(
        [...formErrors, `${rowErrors.length} problem(s) in the file.`, "Nothing was imported."]
          .filter((m) => !m.startsWith("0 problem"))
          .join(" "),
        rowErrors,
      );
    }
    try {
      const { recipe } = await createRecipe(user, input.data);
      return NextResponse.json({
        ok: true,
        message: `${recipe.code} imported as a draft first version: route its initial validation from the recipe's page.`,
        recipeId: recipe.id,
      });
    } catch (error) {
      // A stage mode the washer cannot run names the stage's path: answer with its line.
      if (error instanceof UserFacingError && error.field) {
        const line = built.lineOf(error.field);
        if (line !== null)
          return refuse("1 problem(s) in the file. Nothing was imported.", [
            { line, message: `${columnOf(error.field)}: ${error.message}` },
          ]);
      }
      throw error;
    }
  },
);
