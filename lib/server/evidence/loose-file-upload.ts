import "server-only";
import { NextResponse } from "next/server";
import type { Permission } from "@/lib/auth/permissions";
import { formatSize } from "@/lib/format/number";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { uploadLimitBytes } from "./store-file";

type Store = (
  actor: { id: string; name: string },
  input: { name: string; bytes: Uint8Array },
) => Promise<{ id: string; name: string; sha256: string }>;

/**
 * The route that stores a file bound to no run before the form that cites it is saved (a check
 * photo, a customer's letter, a certificate): multipart `file`, answered with the stored file's id.
 */
export function looseFileUpload(rule: { permission: Permission; missing: string; store: Store }) {
  return defineRoute({ permission: rule.permission }, async ({ request, user }) => {
    const form = await request.formData().catch(() => null);
    const file = form?.get("file");
    if (!(file instanceof File)) return routeError(400, rule.missing);
    const limit = uploadLimitBytes();
    if (file.size > limit)
      throw new UserFacingError(`The file is larger than the limit of ${formatSize(limit)}.`, {
        kind: "too_large",
        field: "file",
      });
    const stored = await rule.store(
      { id: user.id, name: user.name },
      { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) },
    );
    return NextResponse.json({
      ok: true,
      message: `${stored.name} stored (SHA-256 ${stored.sha256.slice(0, 12)}…).`,
      file: stored,
    });
  });
}
