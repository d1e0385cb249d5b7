import "server-only";
import "@/lib/schemas/messages";
import { NextResponse } from "next/server";
import type { z } from "zod";
import { BadCursorError } from "@/lib/api/cursor";
import type { Action } from "@/lib/auth/permissions";
import { jsonError, zodFieldErrors } from "@/lib/http/json";
import { UserFacingError } from "@/lib/server/errors";
import { authenticateApi, type ApiUser } from "./authenticate";

type Params = Record<string, string>;
interface Context<P extends Params> {
  request: Request;
  user: ApiUser;
  params: P;
}

/**
 * One shape for every /api/v1 handler: token and role first, then the handler;
 * a refusal the user can act on becomes 409 with its message, anything else a
 * 500 that says nothing was changed.
 */
export function apiRoute<P extends Params = Params>(rule: { action: Action; mode: "read" | "write" }, handler: (ctx: Context<P>) => Promise<Response>) {
  return async (request: Request, route: { params: Promise<P> }) => {
    const auth = await authenticateApi(request, rule.action, rule.mode);
    if (!auth.ok) return jsonError(auth.status, auth.message);
    try {
      return await handler({ request, user: auth.user, params: await route.params });
    } catch (error) {
      if (error instanceof BadCursorError) return jsonError(400, error.message, { cursor: [error.message] });
      if (error instanceof UserFacingError) return jsonError(409, error.message, error.field ? { [error.field]: [error.message] } : undefined);
      console.error(error);
      return jsonError(500, "Something went wrong on the server. Nothing was changed; try again.");
    }
  };
}

export function ok(body: unknown, status = 200) {
  return NextResponse.json(body, { status, headers: { "Cache-Control": "no-store" } });
}

/** Query-string parameters checked against a strict schema: an unknown parameter is an error, not ignored. */
export function parseQuery<S extends z.ZodType>(request: Request, schema: S): { ok: true; data: z.output<S> } | { ok: false; response: Response } {
  const parsed = schema.safeParse(Object.fromEntries(new URL(request.url).searchParams.entries()));
  if (!parsed.success) return { ok: false, response: jsonError(400, "Some query parameters are not valid.", zodFieldErrors(parsed.error)) };
  return { ok: true, data: parsed.data };
}

/** A JSON body: malformed JSON is 400, a body that breaks the schema (wrong type, missing or unknown field) is 422. */
export async function parseBody<S extends z.ZodType>(request: Request, schema: S): Promise<{ ok: true; data: z.output<S> } | { ok: false; response: Response }> {
  if (!(request.headers.get("content-type") ?? "").toLowerCase().startsWith("application/json")) {
    return { ok: false, response: jsonError(415, "Send the body as JSON with Content-Type: application/json.") };
  }
  let raw: unknown;
  try {
    raw = await request.json();
  } catch {
    return { ok: false, response: jsonError(400, "The body is not valid JSON.") };
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) return { ok: false, response: jsonError(422, "Some fields are not valid.", zodFieldErrors(parsed.error)) };
  return { ok: true, data: parsed.data };
}

/** An id in the path that is not a UUID names nothing. */
export function notFound(what: string) {
  return jsonError(404, `No ${what} with that id.`);
}
