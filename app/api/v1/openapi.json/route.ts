import { NextResponse } from "next/server";
import { buildOpenApiDocument } from "@/lib/api/openapi";

/** The API's description is public: it holds no records, and a client needs it before it has a token. */
export function GET() {
  return NextResponse.json(buildOpenApiDocument(), { headers: { "Cache-Control": "no-store" } });
}
