import { NextResponse } from "next/server";
import { formatSize } from "@/lib/format/number";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { storeCheckPhoto } from "@/lib/server/bath/store-check-photo";
import { UserFacingError } from "@/lib/server/errors";
import { uploadLimitBytes } from "@/lib/server/evidence/store-file";

/** Uploads a nozzle-check or foil-test photo before the log entry is saved; answers the file's id for the form. */
export const POST = defineRoute({ permission: "bath.record" }, async ({ request, user }) => {
  const form = await request.formData().catch(() => null);
  const file = form?.get("file");
  if (!(file instanceof File)) return routeError(400, "Choose the photo.");
  const limit = uploadLimitBytes();
  if (file.size > limit)
    throw new UserFacingError(`The file is larger than the limit of ${formatSize(limit)}.`, {
      kind: "too_large",
      field: "file",
    });
  const stored = await storeCheckPhoto(
    { id: user.id, name: user.name },
    { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) },
  );
  return NextResponse.json({
    ok: true,
    message: `${stored.name} stored (SHA-256 ${stored.sha256.slice(0, 12)}…).`,
    file: stored,
  });
});
