"use server";

import { revalidatePath } from "next/cache";
import { invalid, readJsonPayload, type FormState } from "@/lib/actions/result";
import { systemSchema } from "@/lib/schemas/system";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";
import { updateSystem } from "@/lib/server/systems/update-system";

export async function updateSystemAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("systems.manage");
  if (!auth.ok) return auth;
  const payload = readJsonPayload(formData);
  if (!payload.ok) return payload;
  const parsed = systemSchema.safeParse(payload.value);
  if (!parsed.success) return invalid(parsed.error, "Some values need attention. Nothing was saved.");
  try {
    await updateSystem(auth.user, parsed.data);
    revalidatePath("/systems", "layout");
    return { ok: true, message: "Saved." };
  } catch (error) {
    return toActionFailure(error);
  }
}
