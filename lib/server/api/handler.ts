import "server-only";
import "@/lib/schemas/messages";
import { NextResponse, type NextRequest } from "next/server";
import type { z } from "zod";
import { BadCursorError } from "@/lib/api/cursor";
import { unknownFieldErrors, unknownFieldsMessage } from "@/lib/api/strict-keys";
import { declareEndpoint } from "@/lib/auth/endpoint-rule";
import type { Permission } from "@/lib/auth/permissions";
import { jsonError, zodFieldErrors } from "@/lib/http/json";
import { authorize } from "@/lib/server/auth/current-user";
import type { SessionUser } from "@/lib/server/auth/sessions";
import { describeFailure } from "@/lib/server/errors";
import { authenticateApi, type ApiUser } from "./authenticate";

type Params = Record<string, string>;
interface Context<P extends Params> {
  request: Request;
  user: ApiUser;
  params: P;
}

/**
 * One shape for every /api/v1 handler: token, scope and role first, then the handler; a refusal
 * the user can act on answers with its kind's status (lib/server/errors.ts), anything else a 500
 * that says nothing was changed. The rule travels with the handler for the registry and OpenAPI.
 */
export function apiRoute<P extends Params = Params>(
  rule: { permission: Permission; scope: "read" | "read_write" },
  handler: (ctx: Context<P>) => Promise<Response>,
) {
  const route = async (request: Request, context: { params: Promise<P> }) => {
    const auth = await authenticateApi(
      request,
      rule.permission,
      rule.scope === "read_write" ? "write" : "read",
    );
    if (!auth.ok) return jsonError(auth.status, auth.message);
    try {
      return await handler({ request, user: auth.user, params: await context.params });
    } catch (error) {
      if (error instanceof BadCursorError)
        return jsonError(400, error.message, { cursor: [error.message] });
      const failure = describeFailure(error);
      return jsonError(failure.status, failure.message, failure.fieldErrors);
    }
  };
  return declareEndpoint(route, { auth: "token", permission: rule.permission, scope: rule.scope });
}

interface SessionContext<P extends Params> {
  request: NextRequest;
  user: SessionUser;
  params: P;
}

/** A refusal from a session route, in the one error shape of every route handler: `{ error, fieldErrors }`. */
export function routeError(
  status: number,
  message: string,
  fieldErrors?: Record<string, string[]>,
) {
  return jsonError(status, message, fieldErrors);
}

/**
 * apiRoute's twin for the browser's own routes under app/api (outside v1): the session and the
 * permission first, then the handler; errors answer by kind with routeError.
 */
export function defineRoute<P extends Params = Params>(
  rule: { permission: Permission },
  handler: (ctx: SessionContext<P>) => Promise<Response>,
) {
  const route = async (request: NextRequest, context: { params: Promise<P> }) => {
    const auth = await authorize(rule.permission);
    if (!auth.ok) return routeError(auth.status, auth.message);
    try {
      return await handler({ request, user: auth.user, params: await context.params });
    } catch (error) {
      const failure = describeFailure(error);
      return routeError(failure.status, failure.message, failure.fieldErrors);
    }
  };
  return declareEndpoint(route, { auth: "session", permission: rule.permission });
}

export function ok(body: unknown, status = 200) {
  return NextResponse.json(body, { status, headers: { "Cache-Control": "no-store" } });
}

/** Query-string parameters checked against a strict schema: an unknown parameter is an error, not ignored. */
export function parseQuery<S extends z.ZodType>(
  request: Request,
  schema: S,
): { ok: true; data: z.output<S> } | { ok: false; response: Response } {
  const parsed = schema.safeParse(Object.fromEntries(new URL(request.url).searchParams.entries()));
  if (!parsed.success)
    return {
      ok: false,
      response: jsonError(
        400,
        "Some query parameters are not valid.",
        zodFieldErrors(parsed.error),
      ),
    };
  return { ok: true, data: parsed.data };
}

/**
 * The largest JSON body an /api/v1 route reads. A lab result or a reading is a few kilobytes; the
 * proxy in front cuts a longer body short, which then failed as "not valid JSON" — so the size is
 * checked first and answered with 413 saying the limit.
 */
export const JSON_BODY_LIMIT_BYTES = 1024 * 1024;
const tooLarge = () =>
  jsonError(
    413,
    `The body is larger than the ${JSON_BODY_LIMIT_BYTES / (1024 * 1024)} MB limit for one request. Send fewer items per request.`,
  );

/** The body's text, or null once it passes the limit (a declared length is believed first, then counted). */
async function readLimited(request: Request, limit: number): Promise<string | null> {
  const declared = Number(request.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > limit) return null;
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel().catch(() => undefined);
      return null;
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString("utf8");
}

/**
 * A JSON body: over the limit is 413, malformed JSON 400, and a body that breaks the schema
 * (wrong type, missing field, or a key the schema does not know, at any depth) 422.
 */
export async function parseBody<S extends z.ZodType>(
  request: Request,
  schema: S,
): Promise<{ ok: true; data: z.output<S> } | { ok: false; response: Response }> {
  if (!(request.headers.get("content-type") ?? "").toLowerCase().startsWith("application/json")) {
    return {
      ok: false,
      response: jsonError(415, "Send the body as JSON with Content-Type: application/json."),
    };
  }
  const text = await readLimited(request, JSON_BODY_LIMIT_BYTES);
  if (text === null) return { ok: false, response: tooLarge() };
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    return { ok: false, response: jsonError(400, "The body is not valid JSON.") };
  }
  const extra = unknownFieldErrors(schema, raw);
  if (extra) return { ok: false, response: jsonError(422, unknownFieldsMessage(extra), extra) };
  const parsed = schema.safeParse(raw);
  if (!parsed.success)
    return {
      ok: false,
      response: jsonError(422, "Some fields are not valid.", zodFieldErrors(parsed.error)),
    };
  return { ok: true, data: parsed.data };
}

/** An id in the path that is not a UUID names nothing. */
export function notFound(what: string) {
  return jsonError(404, `No ${what} with that id.`);
}
