import { z } from "zod";
import { formatSize } from "@/lib/format/number";
import { jsonError } from "@/lib/http/json";
import { EVIDENCE_FILE_KINDS } from "@/db/enums";
import { evidenceFileFieldsSchema, EVIDENCE_FILE_FORM_KEYS } from "@/lib/schemas/evidence";
import { apiRoute, notFound, ok } from "@/lib/server/api/handler";
import { getTestRunApi } from "@/lib/server/api/queries";
import { UserFacingError } from "@/lib/server/errors";
import { storeEvidenceFile, uploadLimitBytes } from "@/lib/server/evidence/store-file";

/**
 * Attaches one file (a lab report, a membrane image, the instrument's export) to an open
 * run, through the same service as the run page's upload: the bytes are checked for what
 * they are, stored once under their SHA-256 and linked in one audited transaction.
 */
export const POST = apiRoute<{ runId: string }>(
  { permission: "evidence.record", scope: "read_write" },
  async ({ request, user, params }) => {
    if (!z.uuid().safeParse(params.runId).success) return notFound("test run");
    if (
      !(request.headers.get("content-type") ?? "").toLowerCase().startsWith("multipart/form-data")
    )
      return jsonError(415, "Send the file as multipart/form-data with the fields file and kind.");
    const limit = uploadLimitBytes();
    // Refuse an oversized body before reading it; the file's own size is checked again below.
    if (Number(request.headers.get("content-length") ?? 0) > limit + 64 * 1024)
      throw new UserFacingError(
        `The file is larger than the limit of ${formatSize(limit)}. Nothing was stored.`,
        { kind: "too_large" },
      );
    let form: FormData;
    try {
      form = await request.formData();
    } catch {
      return jsonError(400, "The body is not a readable multipart form.");
    }
    const unknown = [...new Set(form.keys())].filter(
      (k) => !(EVIDENCE_FILE_FORM_KEYS as readonly string[]).includes(k),
    );
    if (unknown.length)
      return jsonError(
        422,
        `Unknown field${unknown.length > 1 ? "s" : ""}: ${unknown.join(", ")}. The form takes file, kind and sampleLabel.`,
        Object.fromEntries(unknown.map((k) => [k, ["This field is not part of the form."]])),
      );
    const file = form.get("file");
    if (!(file instanceof File))
      return jsonError(422, "Attach the file as the form field file.", {
        file: ["Attach the file as the form field file."],
      });
    const fields = evidenceFileFieldsSchema.safeParse({
      kind: form.get("kind"),
      sampleLabel: form.get("sampleLabel"),
    });
    if (!fields.success)
      return jsonError(
        422,
        `Say what kind of file this is: one of ${EVIDENCE_FILE_KINDS.join(", ")}.`,
        { kind: ["Choose what kind of file this is."] },
      );
    if (file.size > limit)
      throw new UserFacingError(
        `The file is ${formatSize(file.size)}; the limit is ${formatSize(limit)}. Nothing was stored.`,
        { kind: "too_large" },
      );
    const { file: row, created } = await storeEvidenceFile(user.actor, {
      runId: params.runId,
      name: file.name,
      bytes: new Uint8Array(await file.arrayBuffer()),
      kind: fields.data.kind,
      sampleLabel: fields.data.sampleLabel,
    });
    return ok(
      { fileId: row.id, sha256: row.sha256, created, run: await getTestRunApi(params.runId) },
      201,
    );
  },
);
