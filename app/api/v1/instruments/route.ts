import { instrumentsQuery } from "@/lib/schemas/instrument-api";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";
import { listInstrumentsApi } from "@/lib/server/instruments/queries";

/** The instrument register by asset number, with each entry's calibration standing today. */
export const GET = apiRoute(
  { permission: "instrument.view", scope: "read" },
  async ({ request }) => {
    const q = parseQuery(request, instrumentsQuery);
    return q.ok ? ok(await listInstrumentsApi(q.data)) : q.response;
  },
);
