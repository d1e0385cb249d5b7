import { Readable } from "node:stream";
import { NextResponse, type NextRequest } from "next/server";
import { z } from "zod";
import { storedText } from "@/lib/schemas/text";
import { isCsvTestType, parseSampleCsv, type ColumnMapping } from "@/lib/evidence/csv-import";
import { checkUpload, FileCheckError, formatSize } from "@/lib/evidence/files";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";
import { importCsvRows } from "@/lib/server/evidence/import-csv";
import { getRunRow } from "@/lib/server/evidence/run-content";
import { getDb } from "@/db/client";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";

const mappingSchema = z.record(z.string(), storedText().max(200));

/**
 * Imports samples (particle counts or filter weighings) from a CSV file into an open run. The file is read as
 * a stream and every row validated; nothing is saved unless the whole file is
 * valid, and then all rows are saved in one transaction with the file as evidence.
 */
export async function POST(request: NextRequest, { params }: { params: Promise<{ runId: string }> }) {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return NextResponse.json({ ok: false, message: auth.message }, { status: auth.status });
  const runId = z.string().uuid().safeParse((await params).runId);
  if (!runId.success) return NextResponse.json({ ok: false, message: "No such run." }, { status: 404 });
  const run = await getRunRow(getDb(), runId.data);
  if (!run) return NextResponse.json({ ok: false, message: "No such run." }, { status: 404 });
  if (!isCsvTestType(run.testType)) return NextResponse.json({ ok: false, message: "CSV import is for particle cleanliness and gravimetric runs." }, { status: 422 });
  const form = await request.formData().catch(() => null);
  const file = form?.get("file");
  if (!(file instanceof File)) return NextResponse.json({ ok: false, message: "Choose a CSV file." }, { status: 400 });
  const limit = uploadLimitBytes();
  if (file.size > limit) return NextResponse.json({ ok: false, message: `The file is larger than the limit of ${formatSize(limit)}. Nothing was imported.` }, { status: 413 });
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
    if (!parsed.success) return NextResponse.json({ ok: false, message: "The column mapping is not valid." }, { status: 400 });
    mapping = Object.fromEntries(Object.entries(parsed.data).filter(([, v]) => v !== "")) as ColumnMapping;
  }
  const result = await parseSampleCsv(Readable.fromWeb(file.stream() as never), { testType: run.testType, mapping, maxRows: 100_000 });
  if (result.fileErrors.length > 0 || result.errorCount > 0) {
    return NextResponse.json(
      {
        ok: false,
        message: result.fileErrors.length > 0 ? result.fileErrors.join(" ") : `${result.errorCount} problem(s) in ${result.rowCount} row(s). Nothing was imported.`,
        headers: result.headers,
        rowErrors: result.errors,
        errorCount: result.errorCount,
      },
      { status: 422 },
    );
  }
  try {
    const bytes = new Uint8Array(await file.arrayBuffer());
    const checked = checkUpload({ name: file.name, bytes, maxBytes: limit });
    const { imported } = await importCsvRows({ id: auth.user.id, name: auth.user.name }, { runId: runId.data, testType: run.testType, rows: result.rows, fileName: checked.name, bytes });
    return NextResponse.json({ ok: true, message: `${imported} sample(s) imported from ${checked.name}.` });
  } catch (error) {
    if (error instanceof FileCheckError) return NextResponse.json({ ok: false, message: error.message }, { status: 422 });
    return NextResponse.json(toActionFailure(error), { status: 422 });
  }
}
