import { NextResponse } from "next/server";
import { z } from "zod";
import { fileStamp } from "@/lib/format/date";
import {
  combinationsCsv,
  EXPORT_KINDS,
  familiesCsv,
  specsCsv,
} from "@/lib/plant/master-data-export";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { masterDataForExport } from "@/lib/server/plant/parts-queries";

const querySchema = z.object({
  format: z.enum(["csv", "json"]),
  kind: z.enum(EXPORT_KINDS).optional(),
});

/**
 * The master data as files: CSV per kind (in the columns the import reads) or all of it as one
 * JSON document. Reading master data is open to every role, as the screens are.
 */
export const GET = defineRoute({ permission: "parts.view" }, async ({ request }) => {
  const url = new URL(request.url);
  const query = querySchema.safeParse({
    format: url.searchParams.get("format") ?? undefined,
    kind: url.searchParams.get("kind") ?? undefined,
  });
  if (!query.success)
    return routeError(
      400,
      "Ask for format=csv with kind=part_families, specifications or combinations, or for format=json.",
    );
  const data = await masterDataForExport();
  const stamp = fileStamp();
  const headers = (type: string, name: string) => ({
    "Content-Type": type,
    "Content-Disposition": `attachment; filename="${name}"`,
    "Cache-Control": "no-store",
  });
  if (query.data.format === "json") {
    return new NextResponse(
      JSON.stringify({ exportedAt: new Date().toISOString(), ...data }, null, 2),
      {
        headers: headers("application/json; charset=utf-8", `washproof-master-data-${stamp}.json`),
      },
    );
  }
  const kind = query.data.kind;
  if (!kind)
    return routeError(
      400,
      "Name the kind to export as CSV: part_families, specifications or combinations.",
    );
  const csv =
    kind === "part_families"
      ? familiesCsv(data.partFamilies)
      : kind === "specifications"
        ? specsCsv(data.specifications)
        : combinationsCsv(data.combinations);
  return new NextResponse(csv + "\r\n", {
    headers: headers("text/csv; charset=utf-8", `washproof-${kind.replace("_", "-")}-${stamp}.csv`),
  });
});
