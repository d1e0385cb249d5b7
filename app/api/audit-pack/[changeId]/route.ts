import { z } from "zod";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { auditPackQuerySchema } from "@/lib/schemas/trace";
import { authorize } from "@/lib/server/auth/current-user";
import { UserFacingError } from "@/lib/server/errors";
import { exportAuditPack } from "@/lib/server/trace/export-audit-pack";

/** A change request's audit pack as a PDF, or a ZIP of the PDF with its evidence files. */
export async function GET(request: Request, { params }: { params: Promise<{ changeId: string }> }) {
  const auth = await authorize("trace.export");
  if (!auth.ok) return jsonError(auth.status, auth.message);
  const { changeId } = await params;
  if (!z.uuid().safeParse(changeId).success) return jsonError(404, "No change request with that id.");
  const query = auditPackQuerySchema.safeParse(searchParamsObject(request.url));
  if (!query.success) return jsonError(400, "Ask for format pdf or zip.", zodFieldErrors(query.error));
  try {
    const pack = await exportAuditPack({ id: auth.user.id, name: auth.user.name }, { changeRequestId: changeId, format: query.data.format });
    return new Response(new Uint8Array(pack.bytes), {
      headers: { "Content-Type": pack.contentType, "Content-Disposition": `attachment; filename="${pack.filename}"`, "Cache-Control": "no-store" },
    });
  } catch (error) {
    if (error instanceof UserFacingError) return jsonError(404, error.message);
    throw error;
  }
}
