import { z } from "zod";
import { getTestRunApi } from "@/lib/server/api/queries";
import { apiRoute, notFound, ok } from "@/lib/server/api/handler";

export const GET = apiRoute<{ runId: string }>(
  { permission: "evidence.view", scope: "read" },
  async ({ params }) => {
    const run = z.uuid().safeParse(params.runId).success
      ? await getTestRunApi(params.runId)
      : undefined;
    return run ? ok(run) : notFound("test run");
  },
);
