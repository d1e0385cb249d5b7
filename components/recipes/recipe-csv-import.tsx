"use client";

import { useRouter } from "next/navigation";
import { CsvMappingImport } from "@/components/ui/csv-mapping-import";
import { Field, TextareaField } from "@/components/ui/field";
import { autoMapMasterData, masterDataFields, masterDataNeeds } from "@/lib/plant/csv-master-data";
import { masterDataMappingProblems } from "@/lib/plant/master-data-mapping";
import { RECIPE_CSV_TEMPLATE } from "@/lib/recipes/csv";

/** A new recipe for a washer from a CSV of its stages and parameters: all of it or nothing. */
export function RecipeCsvImport({ systemId }: { systemId: string }) {
  const router = useRouter();
  const fields = masterDataFields("recipe_parameters");
  const needs = masterDataNeeds("recipe_parameters");
  const template = `data:text/csv;charset=utf-8,${encodeURIComponent(`\uFEFF${RECIPE_CSV_TEMPLATE}`)}`;
  return (
    <CsvMappingImport
      title="Import a recipe from CSV"
      fileLabel="CSV file of the recipe's stages and parameters"
      fields={fields}
      autoMap={(headers) => autoMapMasterData("recipe_parameters", headers)}
      problems={(mapping, headers) =>
        masterDataMappingProblems("recipe_parameters", mapping, headers)
      }
      url={`/api/systems/${systemId}/recipes/import`}
      onDone={(result) => {
        if (typeof result.recipeId === "string") router.push(`/systems/recipes/${result.recipeId}`);
      }}
      hint={
        <>
          One row per parameter, its stage named on every row, stages in process order; comma or
          semicolon separated, UTF-8. Columns:{" "}
          {fields.map((f, i) => (
            <span key={f.key}>
              {i > 0 && ", "}
              <code>{f.key}</code>
              {needs.includes(f.key) ? "" : " (optional)"}
            </span>
          ))}
          .{" "}
          <a
            href={template}
            download="recipe-parameters-template.csv"
            className="text-brand-800 underline"
          >
            Download the template
          </a>
          .
        </>
      }
    >
      <div className="grid gap-3 md:grid-cols-2">
        <Field name="code" label="Recipe code" required hint="Letters, digits and . _ / -" />
        <Field name="name" label="Recipe name" required />
        <Field name="detergent" label="Detergent" />
        <Field name="description" label="Description" />
      </div>
      <TextareaField name="notes" label="Notes" rows={2} />
    </CsvMappingImport>
  );
}
