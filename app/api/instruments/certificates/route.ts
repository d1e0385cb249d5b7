import { NextResponse } from "next/server";
import { formatSize } from "@/lib/format/number";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";
import { storeCertificate } from "@/lib/server/instruments/store-certificate";

/** Uploads a calibration certificate before the calibration is saved; answers the file's id for the form. */
export const POST = defineRoute({ permission: "instrument.manage" }, async ({ request, user }) => {
  const form = await request.formData().catch(() => null);
  const file = form?.get("file");
  if (!(file instanceof File)) return routeError(400, "Choose the certificate file.");
  const limit = uploadLimitBytes();
  if (file.size > limit)
    throw new UserFacingError(`The file is larger than the limit of ${formatSize(limit)}.`, {
      kind: "too_large",
      field: "file",
    });
  const stored = await storeCertificate(
    { id: user.id, name: user.name },
    { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) },
  );
  return NextResponse.json({
    ok: true,
    message: `${stored.name} stored (SHA-256 ${stored.sha256.slice(0, 12)}…).`,
    file: stored,
  });
});
