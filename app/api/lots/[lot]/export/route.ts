import { getDb } from "@/db/client";
import { lotHistoryCsv } from "@/lib/cycles/lot-export";
import { fileStamp } from "@/lib/format/date";
import { lotFromPath } from "@/lib/schemas/cycle";
import { defineRoute, routeError } from "@/lib/server/api/handler";
import { lotHistory } from "@/lib/server/cycles/queries";
import { renderPdf } from "@/lib/server/pdf/render-pdf";
import { loadLetterhead } from "@/lib/server/plant/letterhead";

/** The lot history page as a file: CSV for a spreadsheet, PDF for the customer or the auditor. */
export const GET = defineRoute<{ lot: string }>(
  { permission: "evidence.view" },
  async ({ request, user, params }) => {
    const lot = lotFromPath(params.lot);
    if (!lot.success) return routeError(404, "No such lot.");
    const format = new URL(request.url).searchParams.get("format") ?? "csv";
    if (format !== "csv" && format !== "pdf")
      return routeError(400, "Ask for format=csv or format=pdf.");
    const history = await lotHistory(lot.data);
    if (history.cycles.length === 0) return routeError(404, "No cycle washed this lot.");
    const name = `washproof-lot-${lot.data.replace(/[^A-Za-z0-9._-]/g, "_")}-${fileStamp()}`;
    if (format === "csv")
      return new Response(lotHistoryCsv(history), {
        headers: {
          "Content-Type": "text/csv; charset=utf-8",
          "Content-Disposition": `attachment; filename="${name}.csv"`,
        },
      });
    const bytes = await renderPdf({
      kind: "lot-history",
      input: {
        history,
        // The worker has no database: the header's company and site travel in the job.
        letterhead: await loadLetterhead(getDb(), null),
        printedAt: new Date().toISOString(),
        printedBy: user.name,
      },
    });
    return new Response(Buffer.from(bytes), {
      headers: {
        "Content-Type": "application/pdf",
        "Content-Disposition": `attachment; filename="${name}.pdf"`,
      },
    });
  },
);
