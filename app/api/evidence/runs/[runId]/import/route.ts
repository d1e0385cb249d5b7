import { NextResponse } from "next/server";
import { z } from "zod";
import { storedText } from "@/lib/schemas/text";
import { isCsvTestType, parseSampleCsv, type ColumnMapping } from "@/lib/evidence/csv-import";
import { checkUpload, FileCheckError } from "@/lib/evidence/files";
import { formatSize } from "@/lib/format/number";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { importCsvRows } from "@/lib/server/evidence/import-csv";
import { getRunRow } from "@/lib/server/evidence/run-content";
import { getDb } from "@/db/client";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";

const mappingSchema = z.record(z.string(), storedText().max(200));

/**
 * Imports samples (particle counts or filter weighings) from a CSV file into an open run. Every row is
 * validated, a batch at a time so other requests are answered meanwhile; nothing is saved unless the
 * whole file is valid, and then all rows are saved in one transaction with the file as evidence.
 */
export const POST = defineRoute<{ runId: string }>(
  { permission: "evidence.record" },
  async ({ request, user, params }) => {
    const runId = z.string().uuid().safeParse(params.runId);
    if (!runId.success) return routeError(404, "No such run.");
    const run = await getRunRow(getDb(), runId.data);
    if (!run) return routeError(404, "No such run.");
    if (!isCsvTestType(run.testType))
      throw new UserFacingError("CSV import is for particle cleanliness and gravimetric runs.", {
        kind: "invalid",
      });
    const form = await request.formData().catch(() => null);
    const file = form?.get("file");
    if (!(file instanceof File)) return routeError(400, "Choose a CSV file.");
    const limit = uploadLimitBytes();
    if (file.size > limit)
      throw new UserFacingError(
        `The file is larger than the limit of ${formatSize(limit)}. Nothing was imported.`,
        { kind: "too_large" },
      );
    let mapping: ColumnMapping | undefined;
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
      mapping = Object.fromEntries(
        Object.entries(parsed.data).filter(([, v]) => v !== ""),
      ) as ColumnMapping;
    }
    // The form has already buffered the file (at most the upload limit), and its web stream hands it over
    // in one chunk: parsed as text, the rows are validated in batches with the event loop turning between them.
    const result = await parseSampleCsv(await file.text(), {
      testType: run.testType,
      mapping,
      maxRows: 100_000,
    });
    if (result.fileErrors.length > 0 || result.errorCount > 0) {
      return NextResponse.json(
        {
          ok: false,
          message:
            result.fileErrors.length > 0
              ? result.fileErrors.join(" ")
              : `${result.errorCount} problem(s) in ${result.rowCount} row(s). Nothing was imported.`,
          headers: result.headers,
          rowErrors: result.errors,
          errorCount: result.errorCount,
        },
        { status: 422 },
      );
    }
    const bytes = new Uint8Array(await file.arrayBuffer());
    let checked: ReturnType<typeof checkUpload>;
    try {
      checked = checkUpload({ name: file.name, bytes, maxBytes: limit });
    } catch (error) {
      if (error instanceof FileCheckError)
        throw new UserFacingError(error.message, { kind: error.kind });
      throw error;
    }
    const { imported } = await importCsvRows(
      { id: user.id, name: user.name },
      {
        runId: runId.data,
        testType: run.testType,
        rows: result.rows,
        fileName: checked.name,
        bytes,
      },
    );
    return NextResponse.json({
      ok: true,
      message: `${imported} sample(s) imported from ${checked.name}.`,
    });
  },
);
