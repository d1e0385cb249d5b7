import { NextResponse } from "next/server";
import { formatSize } from "@/lib/format/number";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";
import { attachNcFile } from "@/lib/server/nonconformances/attach-file";

/** Uploads a concession letter or effectiveness evidence to a nonconformance (multipart: file). */
export const POST = defineRoute<{ ncId: string }>(
  { permission: "nc.work" },
  async ({ request, user, params }) => {
    const limit = uploadLimitBytes();
    const declared = Number(request.headers.get("content-length") ?? 0);
    if (declared > limit + 64 * 1024)
      throw new UserFacingError(
        `The file is larger than the limit of ${formatSize(limit)}. Nothing was stored.`,
        { kind: "too_large" },
      );
    const form = await request.formData().catch(() => null);
    const file = form?.get("file");
    if (!(file instanceof File)) return routeError(400, "Choose the file to upload.");
    if (file.size > limit)
      throw new UserFacingError(`The file is larger than the limit of ${formatSize(limit)}.`, {
        kind: "too_large",
        field: "file",
      });
    const stored = await attachNcFile(
      { id: user.id, name: user.name },
      {
        nonconformanceId: params.ncId,
        name: file.name,
        bytes: new Uint8Array(await file.arrayBuffer()),
      },
    );
    return NextResponse.json({
      ok: true,
      message: `${stored.name} stored (SHA-256 ${stored.sha256.slice(0, 12)}…).`,
      file: stored,
    });
  },
);
