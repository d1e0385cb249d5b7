import { NextResponse } from "next/server";
import { z } from "zod";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { exportVersionPdf } from "@/lib/server/documents/export-pdf";

const paramsSchema = z.object({
  documentId: z.string().uuid(),
  version: z.coerce.number().int().min(1),
});

/** Any version as a PDF: signatures, content hash, page X of Y; "Uncontrolled copy" unless effective. */
export const GET = defineRoute<{ documentId: string; version: string }>(
  { permission: "document.export" },
  async ({ user, params }) => {
    const parsed = paramsSchema.safeParse(params);
    if (!parsed.success) return routeError(404, "No such document version.");
    const pdf = await exportVersionPdf(user, parsed.data);
    if (!pdf) return routeError(404, "No such document version.");
    return new NextResponse(new Uint8Array(pdf.bytes), {
      headers: {
        "Content-Type": "application/pdf",
        "Content-Disposition": `attachment; filename="${pdf.filename}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
