import { NextResponse, type NextRequest } from "next/server";
import { z } from "zod";
import { storedText } from "@/lib/schemas/text";
import { formatSize } from "@/lib/evidence/files";
import { fileKindSchema } from "@/lib/schemas/evidence";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";
import { storeEvidenceFile, uploadLimitBytes } from "@/lib/server/evidence/store-file";

const fieldsSchema = z.object({
  runId: z.string().uuid(),
  kind: fileKindSchema,
  sampleLabel: z.preprocess((v) => (v === "" || v === null ? undefined : v), storedText().trim().max(60).optional()),
});

/** Uploads one evidence file to an open run (multipart form: file, kind, sampleLabel). */
export async function POST(request: NextRequest, { params }: { params: Promise<{ runId: string }> }) {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return NextResponse.json({ ok: false, message: auth.message }, { status: auth.status });
  const limit = uploadLimitBytes();
  // Refuse an oversized body before reading it; the file size is checked again below.
  const declared = Number(request.headers.get("content-length") ?? 0);
  if (declared > limit + 64 * 1024) {
    return NextResponse.json({ ok: false, message: `The file is larger than the limit of ${formatSize(limit)}. Nothing was stored.` }, { status: 413 });
  }
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    return NextResponse.json({ ok: false, message: "Send the file as a multipart form." }, { status: 400 });
  }
  const file = form.get("file");
  const fields = fieldsSchema.safeParse({ runId: (await params).runId, kind: form.get("kind"), sampleLabel: form.get("sampleLabel") });
  if (!fields.success) return NextResponse.json({ ok: false, message: "Choose what kind of file this is.", fieldErrors: { kind: ["Choose what kind of file this is."] } }, { status: 400 });
  if (!(file instanceof File)) return NextResponse.json({ ok: false, message: "Choose a file to upload.", fieldErrors: { file: ["Choose a file to upload."] } }, { status: 400 });
  if (file.size > limit) {
    return NextResponse.json({ ok: false, message: `The file is ${formatSize(file.size)}; the limit is ${formatSize(limit)}. Nothing was stored.` }, { status: 413 });
  }
  try {
    const bytes = new Uint8Array(await file.arrayBuffer());
    const { file: row, created } = await storeEvidenceFile({ id: auth.user.id, name: auth.user.name }, { runId: fields.data.runId, name: file.name, bytes, kind: fields.data.kind, sampleLabel: fields.data.sampleLabel });
    return NextResponse.json({ ok: true, message: `${row.originalName} uploaded${created ? "" : " (these bytes were already stored; they are kept once)"}.`, fileId: row.id, sha256: row.sha256 });
  } catch (error) {
    const failure = toActionFailure(error);
    return NextResponse.json(failure, { status: 422 });
  }
}
