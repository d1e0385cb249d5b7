import { createHash } from "node:crypto";
import { NextResponse } from "next/server";
import { z } from "zod";
import { parseCycleCsv, valueFields, CYCLE_FIELDS, FIELD_WORDS } from "@/lib/cycles/csv";
import { checkUpload, FileCheckError } from "@/lib/evidence/files";
import { formatSize } from "@/lib/format/number";
import { storedText } from "@/lib/schemas/text";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { CycleRecordingError } from "@/lib/server/cycles/record-cycles";
import { cycleValueParameters } from "@/lib/server/cycles/queries";
import { recordCycles } from "@/lib/server/cycles/record-cycles-now";
import { UserFacingError } from "@/lib/server/errors";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";

const mappingSchema = z.record(z.string().max(100), storedText().max(200));

/**
 * Imports a washer's cycle log through the column-mapping screen. Every row is validated, then the
 * whole file is recorded through the cycle service in one transaction, or nothing is: each refusal,
 * from the file or from the plant's records, is answered with its line.
 */
export const POST = defineRoute({ permission: "evidence.record" }, async ({ request, user }) => {
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
  const bytes = new Uint8Array(await file.arrayBuffer());
  let name: string;
  try {
    name = checkUpload({ name: file.name, bytes, maxBytes: limit }).name;
  } catch (error) {
    if (error instanceof FileCheckError)
      throw new UserFacingError(error.message, { kind: error.kind });
    throw error;
  }
  const fields = [...CYCLE_FIELDS, ...valueFields(await cycleValueParameters())];
  const result = parseCycleCsv(new TextDecoder().decode(bytes), {
    fields,
    mapping,
    maxRows: 100_000,
  });
  const refuse = (
    message: string,
    rowErrors: { line: number; message: string }[],
    errorCount: number,
  ) => NextResponse.json({ ok: false, message, rowErrors, errorCount }, { status: 422 });
  if (result.fileErrors.length > 0) return refuse(result.fileErrors.join(" "), [], 0);
  if (result.errorCount > 0)
    return refuse(
      `${result.errorCount} problem(s) in ${result.rowCount} row(s). Nothing was imported.`,
      result.errors,
      result.errorCount,
    );
  try {
    const recorded = await recordCycles(
      { id: user.id, name: user.name },
      {
        source: "csv",
        cycles: result.rows.map((r) => r.cycle),
        file: { name, sha256: createHash("sha256").update(bytes).digest("hex") },
      },
    );
    return NextResponse.json({
      ok: true,
      message: `${recorded.recorded} cycle(s) imported from ${name}${recorded.flagged.length ? `; ${recorded.flagged.length} flagged for values outside their validated range` : ""}.`,
    });
  } catch (error) {
    if (!(error instanceof CycleRecordingError)) throw error;
    const rowErrors = error.problems.map((p) => ({
      line: result.rows[p.index].line,
      message: `${FIELD_WORDS[p.field.split(".")[0]] ?? p.field}: ${p.message}`,
    }));
    return refuse(
      `${error.problemCount} problem(s) in ${result.rowCount} row(s). Nothing was imported.`,
      rowErrors,
      error.problemCount,
    );
  }
});
