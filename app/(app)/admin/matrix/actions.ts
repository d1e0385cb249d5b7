"use server";

import { revalidatePath } from "next/cache";
import { invalid, readJsonPayload, type FormState } from "@/lib/actions/result";
import { matrixSchema } from "@/lib/schemas/change";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";
import { versionMatrix } from "@/lib/server/matrix/version-matrix";

export async function saveMatrixAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("matrix.manage");
  if (!auth.ok) return auth;
  const payload = readJsonPayload(formData);
  if (!payload.ok) return payload;
  const parsed = matrixSchema.safeParse(payload.value);
  if (!parsed.success) return invalid(parsed.error);
  try {
    const m = await versionMatrix(auth.user, parsed.data);
    revalidatePath("/admin/matrix");
    return { ok: true, message: `Saved as version ${m.version}; it applies to change requests assessed from now on.` };
  } catch (error) {
    return toActionFailure(error);
  }
}
