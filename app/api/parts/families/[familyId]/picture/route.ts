import { NextResponse } from "next/server";
import { z } from "zod";
import { formatSize } from "@/lib/format/number";
import { PICTURE_MAX_BYTES } from "@/lib/parts/picture";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { readFamilyPicture, setFamilyPicture } from "@/lib/server/plant/set-family-picture";

const id = z.uuid();

/** The part family's picture, shown on its page; reading it is as open as the page. */
export const GET = defineRoute<{ familyId: string }>(
  { permission: "parts.view" },
  async ({ params }) => {
    const familyId = id.safeParse(params.familyId);
    if (!familyId.success) return routeError(404, "No such part family.");
    const picture = await readFamilyPicture(familyId.data);
    if (!picture) return routeError(404, "This part family has no picture.");
    return new NextResponse(Buffer.from(picture.bytes), {
      headers: {
        "Content-Type": picture.mimeType,
        "Content-Length": String(picture.bytes.byteLength),
        "X-Content-Type-Options": "nosniff",
        "Content-Security-Policy": "default-src 'none'",
        ETag: `"${picture.sha256}"`,
        "Cache-Control": "private, max-age=0, must-revalidate",
      },
    });
  },
);

/** Uploads a new picture for the family (PNG or JPEG, by content), replacing the one shown. */
export const POST = defineRoute<{ familyId: string }>(
  { permission: "parts.manage" },
  async ({ request, user, params }) => {
    const familyId = id.safeParse(params.familyId);
    if (!familyId.success) return routeError(404, "No such part family.");
    const form = await request.formData().catch(() => null);
    const file = form?.get("file");
    if (!(file instanceof File)) return routeError(400, "Choose a PNG or JPEG picture.");
    if (file.size > PICTURE_MAX_BYTES)
      throw new UserFacingError(
        `The picture is larger than the limit of ${formatSize(PICTURE_MAX_BYTES)}: save it smaller.`,
        { kind: "too_large", field: "file" },
      );
    await setFamilyPicture(
      { id: user.id, name: user.name },
      {
        partFamilyId: familyId.data,
        name: file.name,
        bytes: new Uint8Array(await file.arrayBuffer()),
      },
    );
    return NextResponse.json({ ok: true, message: "Picture saved." });
  },
);
