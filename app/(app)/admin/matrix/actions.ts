"use server";

import { defineAction } from "@/lib/actions/define-action";
import { matrixSchema } from "@/lib/schemas/change";
import { versionMatrix } from "@/lib/server/matrix/version-matrix";

export const saveMatrixAction = defineAction({
  permission: "matrix.manage",
  input: matrixSchema,
  from: "payload",
  run: async ({ user, input }) => {
    const m = await versionMatrix(user, input);
    return {
      message: `Saved as version ${m.version}; it applies to change requests assessed from now on.`,
    };
  },
  revalidate: ["/admin/matrix"],
});
