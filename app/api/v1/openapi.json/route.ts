import { NextResponse } from "next/server";
import { buildOpenApiDocument } from "@/lib/api/openapi";
import { publicRoute } from "@/lib/server/api/handler";

/** The API's description is public: it holds no records, and a client needs it before it has a token. */
export const GET = publicRoute(() => NextResponse.json(buildOpenApiDocument(), { headers: { "Cache-Control": "no-store" } }));
