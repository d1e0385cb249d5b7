import { z } from "zod";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { auditPackQuerySchema } from "@/lib/schemas/trace";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { exportAuditPack } from "@/lib/server/trace/export-audit-pack";

/** A change request's audit pack as a PDF, or a ZIP of the PDF with its evidence files. */
export const GET = defineRoute<{ changeId: string }>(
  { permission: "trace.export" },
  async ({ request, user, params }) => {
    if (!z.uuid().safeParse(params.changeId).success)
      return routeError(404, "No change request with that id.");
    const query = auditPackQuerySchema.safeParse(searchParamsObject(request.url));
    if (!query.success)
      return jsonError(400, "Ask for format pdf or zip.", zodFieldErrors(query.error));
    const pack = await exportAuditPack(
      { id: user.id, name: user.name },
      { changeRequestId: params.changeId, format: query.data.format },
    );
    return new Response(new Uint8Array(pack.bytes), {
      headers: {
        "Content-Type": pack.contentType,
        "Content-Disposition": `attachment; filename="${pack.filename}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
