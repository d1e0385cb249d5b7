import { z } from "zod";
import { getChangeRequestApi } from "@/lib/server/api/queries";
import { apiRoute, notFound, ok } from "@/lib/server/api/handler";

export const GET = apiRoute<{ changeRequestId: string }>(
  { permission: "changes.view", scope: "read" },
  async ({ params }) => {
    const cr = z.uuid().safeParse(params.changeRequestId).success
      ? await getChangeRequestApi(params.changeRequestId)
      : undefined;
    return cr ? ok(cr) : notFound("change request");
  },
);
