import { NextResponse } from "next/server";
import { z } from "zod";
import { authorize } from "@/lib/server/auth/current-user";
import { exportVersionPdf } from "@/lib/server/documents/export-pdf";

const paramsSchema = z.object({ documentId: z.string().uuid(), version: z.coerce.number().int().min(1) });

/** Any version as a PDF: signatures, content hash, page X of Y; "Uncontrolled copy" unless effective. */
export async function GET(_request: Request, { params }: { params: Promise<{ documentId: string; version: string }> }) {
  const auth = await authorize("document.export");
  if (!auth.ok) return NextResponse.json({ error: auth.message }, { status: auth.status });
  const parsed = paramsSchema.safeParse(await params);
  if (!parsed.success) return NextResponse.json({ error: "No such document version." }, { status: 404 });
  const pdf = await exportVersionPdf(auth.user, parsed.data);
  if (!pdf) return NextResponse.json({ error: "No such document version." }, { status: 404 });
  return new NextResponse(new Uint8Array(pdf.bytes), {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="${pdf.filename}"`,
      "Cache-Control": "no-store",
    },
  });
}
