import { NextResponse } from "next/server";
import { z } from "zod";
import { formatSize } from "@/lib/format/number";
import { evidenceFileFieldsSchema } from "@/lib/schemas/evidence";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { UserFacingError } from "@/lib/server/errors";
import { storeEvidenceFile, uploadLimitBytes } from "@/lib/server/evidence/store-file";

const fieldsSchema = evidenceFileFieldsSchema.extend({ runId: z.string().uuid() });

/** Uploads one evidence file to an open run (multipart form: file, kind, sampleLabel). */
export const POST = defineRoute<{ runId: string }>(
  { permission: "evidence.record" },
  async ({ request, user, params }) => {
    const limit = uploadLimitBytes();
    // Refuse an oversized body before reading it; the file size is checked again below.
    const declared = Number(request.headers.get("content-length") ?? 0);
    if (declared > limit + 64 * 1024)
      throw new UserFacingError(
        `The file is larger than the limit of ${formatSize(limit)}. Nothing was stored.`,
        { kind: "too_large" },
      );
    let form: FormData;
    try {
      form = await request.formData();
    } catch {
      return routeError(400, "Send the file as a multipart form.");
    }
    const file = form.get("file");
    const fields = fieldsSchema.safeParse({
      runId: params.runId,
      kind: form.get("kind"),
      sampleLabel: form.get("sampleLabel"),
    });
    if (!fields.success)
      return routeError(400, "Choose what kind of file this is.", {
        kind: ["Choose what kind of file this is."],
      });
    if (!(file instanceof File))
      return routeError(400, "Choose a file to upload.", { file: ["Choose a file to upload."] });
    if (file.size > limit)
      throw new UserFacingError(
        `The file is ${formatSize(file.size)}; the limit is ${formatSize(limit)}. Nothing was stored.`,
        { kind: "too_large" },
      );
    const bytes = new Uint8Array(await file.arrayBuffer());
    const { file: row, created } = await storeEvidenceFile(
      { id: user.id, name: user.name },
      {
        runId: fields.data.runId,
        name: file.name,
        bytes,
        kind: fields.data.kind,
        sampleLabel: fields.data.sampleLabel,
      },
    );
    return NextResponse.json({
      ok: true,
      message: `${row.originalName} uploaded${created ? "" : " (these bytes were already stored; they are kept once)"}.`,
      fileId: row.id,
      sha256: row.sha256,
    });
  },
);
