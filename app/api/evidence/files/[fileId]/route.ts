import { NextResponse } from "next/server";
import { z } from "zod";
import { authorize } from "@/lib/server/auth/current-user";
import { readEvidenceFile } from "@/lib/server/evidence/read-file";

/** Serves an evidence file to an authorised reader after re-checking its hash; every download is audited. */
export async function GET(_request: Request, { params }: { params: Promise<{ fileId: string }> }) {
  const auth = await authorize("evidence.view");
  if (!auth.ok) return NextResponse.json({ error: auth.message }, { status: auth.status });
  const id = z.string().uuid().safeParse((await params).fileId);
  if (!id.success) return NextResponse.json({ error: "No such file." }, { status: 404 });
  const result = await readEvidenceFile({ id: auth.user.id, name: auth.user.name }, id.data);
  if (!result.ok) return NextResponse.json({ error: result.message }, { status: result.status });
  return new NextResponse(Buffer.from(result.bytes), {
    headers: {
      "Content-Type": result.mimeType,
      "Content-Length": String(result.bytes.byteLength),
      "Content-Disposition": `attachment; filename="${result.name.replace(/[^\x20-\x7e]/g, "_").replace(/"/g, "'")}"; filename*=UTF-8''${encodeURIComponent(result.name)}`,
      "X-Content-Type-Options": "nosniff",
      "Cache-Control": "private, no-store",
    },
  });
}
