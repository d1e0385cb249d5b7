import { NextResponse } from "next/server";
import { z } from "zod";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { readEvidenceFile } from "@/lib/server/evidence/read-file";

/** Serves an evidence file to an authorised reader after re-checking its hash; every download is audited. */
export const GET = defineRoute<{ fileId: string }>(
  { permission: "evidence.view" },
  async ({ user, params }) => {
    const id = z.string().uuid().safeParse(params.fileId);
    if (!id.success) return routeError(404, "No such file.");
    const result = await readEvidenceFile({ id: user.id, name: user.name }, id.data);
    if (!result.ok) return routeError(result.status, result.message);
    return new NextResponse(Buffer.from(result.bytes), {
      headers: {
        "Content-Type": result.mimeType,
        "Content-Length": String(result.bytes.byteLength),
        "Content-Disposition": `attachment; filename="${result.name.replace(/[^\x20-\x7e]/g, "_").replace(/"/g, "'")}"; filename*=UTF-8''${encodeURIComponent(result.name)}`,
        "X-Content-Type-Options": "nosniff",
        "Cache-Control": "private, no-store",
      },
    });
  },
);
