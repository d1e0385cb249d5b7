import { NextResponse } from "next/server";
import { z } from "zod";
import { parseMasterDataCsv, type MasterDataMapping } from "@/lib/plant/csv-master-data";
import { formatSize } from "@/lib/format/number";
import { storedText } from "@/lib/schemas/text";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";
import { importMasterData } from "@/lib/server/plant/import-master-data";

const kindSchema = z.enum(["part_families", "specifications"]);
const mappingSchema = z.record(z.string().max(60), storedText().max(200));
// Master data for one plant runs to hundreds of rows; a larger file is more likely a wrong file [practice].
const MAX_ROWS = 5000;
const WHAT = {
  part_families: ["part family", "part families"],
  specifications: ["specification", "specifications"],
} as const;

/**
 * Imports part families or customer specifications from a CSV file: every row is checked with the
 * entry form's schema, then saved through the entry form's services in one transaction. Any bad
 * row, in the file or against the register, and nothing is saved; each problem names its line.
 */
export const POST = defineRoute({ permission: "parts.manage" }, async ({ request, user }) => {
  const form = await request.formData().catch(() => null);
  const kind = kindSchema.safeParse(form?.get("kind"));
  if (!kind.success)
    return routeError(400, "Choose what the file holds: part families or specifications.");
  const file = form?.get("file");
  if (!(file instanceof File)) return routeError(400, "Choose a CSV file.");
  const limit = uploadLimitBytes();
  if (file.size > limit)
    throw new UserFacingError(
      `The file is larger than the limit of ${formatSize(limit)}. Nothing was imported.`,
      { kind: "too_large" },
    );
  let mapping: MasterDataMapping | undefined;
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
  const text = new TextDecoder("utf-8", { fatal: false })
    .decode(await file.arrayBuffer())
    .replace(/^\uFEFF/, "");
  const parsed = parseMasterDataCsv(kind.data, text, { mapping, maxRows: MAX_ROWS });
  const refuse = (message: string, rowErrors: { line: number; message: string }[]) =>
    NextResponse.json(
      {
        ok: false,
        message,
        headers: parsed.headers,
        rowErrors: rowErrors.slice(0, 50),
        errorCount: rowErrors.length,
      },
      { status: 422 },
    );
  if (parsed.fileErrors.length) return refuse(parsed.fileErrors.join(" "), []);
  if (parsed.errors.length)
    return refuse(
      `${parsed.errors.length} problem(s) in the file. Nothing was imported.`,
      parsed.errors,
    );
  const saved =
    kind.data === "part_families"
      ? await importMasterData(user, { kind: "part_families", rows: parsed.rows as never })
      : await importMasterData(user, { kind: "specifications", rows: parsed.rows as never });
  if (!saved.ok)
    return refuse(
      `${saved.errors.length} row(s) clash with the register. Nothing was imported.`,
      saved.errors,
    );
  return NextResponse.json({
    ok: true,
    message: `${saved.imported} ${WHAT[kind.data][saved.imported === 1 ? 0 : 1]} imported.`,
  });
});
