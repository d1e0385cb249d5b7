import { NextResponse } from "next/server";
import { z } from "zod";
import { apiRoute, notFound } from "@/lib/server/api/handler";
import { exportTestReport } from "@/lib/server/lab-report/export-test-report";

/** The run's test report PDF for a LIMS or a customer portal; the export is audited under the token's owner. */
export const GET = apiRoute<{ runId: string }>(
  { permission: "evidence.view", scope: "read" },
  async ({ user, params }) => {
    if (!z.uuid().safeParse(params.runId).success) return notFound("test run");
    const pdf = await exportTestReport(user.actor, params.runId);
    if (!pdf) return notFound("test run");
    return new NextResponse(new Uint8Array(pdf.bytes), {
      headers: {
        "Content-Type": "application/pdf",
        "Content-Disposition": `attachment; filename="${pdf.filename}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
