import { NextResponse } from "next/server";
import { buildOpenApiDocument } from "@/lib/api/openapi";
import { declareEndpoint } from "@/lib/auth/endpoint-rule";

/** The API's description is public: it holds no records, and a client needs it before it has a token. */
export const GET = declareEndpoint(
  () => NextResponse.json(buildOpenApiDocument(), { headers: { "Cache-Control": "no-store" } }),
  { auth: "public" },
);
