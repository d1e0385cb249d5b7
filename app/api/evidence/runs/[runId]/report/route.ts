import { NextResponse } from "next/server";
import { z } from "zod";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { exportTestReport } from "@/lib/server/lab-report/export-test-report";

/** A run's test report as a PDF: signatures with the content hash, page X of Y, controlled only once verified. */
export const GET = defineRoute<{ runId: string }>(
  { permission: "evidence.view" },
  async ({ user, params }) => {
    if (!z.uuid().safeParse(params.runId).success) return routeError(404, "No such test run.");
    const pdf = await exportTestReport({ id: user.id, name: user.name }, params.runId);
    if (!pdf) return routeError(404, "No such test run.");
    return new NextResponse(new Uint8Array(pdf.bytes), {
      headers: {
        "Content-Type": "application/pdf",
        "Content-Disposition": `attachment; filename="${pdf.filename}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
