import { readdirSync } from "node:fs";
import { join, resolve } from "node:path";
import type { Client } from "@libsql/client";
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import type { Database } from "@/db/client";
import { users } from "@/db/schema";
import { ROLES, type Role } from "@/lib/auth/permissions";
import { SESSION_COOKIE } from "@/lib/auth/session-cookie";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { createSession } from "@/lib/server/auth/sessions";
import { setSessionCookie } from "./request-context";

const ROOT = resolve(__dirname, "../../..");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

type Fn = (...args: unknown[]) => unknown;
export interface Endpoint {
  key: string;
  kind: "action" | "route";
  file: string;
  fn: Fn;
  /** Route handlers: the method and the names of the dynamic segments in the path. */
  method?: (typeof METHODS)[number];
  params: string[];
}

/** Every export of every app/**\/actions.ts and every HTTP method of every app/**\/route.ts, found on disk. */
export async function discoverEndpoints(): Promise<Endpoint[]> {
  const files = (readdirSync(join(ROOT, "app"), { recursive: true }) as string[])
    .map((f) => `app/${f.split("\\").join("/")}`)
    .filter((f) => f.endsWith("/actions.ts") || f.endsWith("/route.ts"))
    .sort();
  const out: Endpoint[] = [];
  for (const file of files) {
    const mod = (await import(/* @vite-ignore */ join(ROOT, file))) as Record<string, unknown>;
    const params = [...file.matchAll(/\[(\w+)\]/g)].map((m) => m[1]);
    if (file.endsWith("/actions.ts")) {
      for (const [name, fn] of Object.entries(mod)) {
        if (typeof fn === "function")
          out.push({ key: `${file}#${name}`, kind: "action", file, fn: fn as Fn, params });
      }
    } else {
      for (const method of METHODS) {
        if (typeof mod[method] === "function")
          out.push({
            key: `${method} ${file}`,
            kind: "route",
            file,
            fn: mod[method] as Fn,
            method,
            params,
          });
      }
    }
  }
  return out;
}

export type Outcome =
  | { kind: "result"; value: { ok?: boolean; status?: number; message?: unknown } }
  | { kind: "redirect"; to: string }
  | { kind: "forbidden" }
  | { kind: "response"; status: number; body: string; contentType: string }
  | { kind: "threw"; error: unknown };

/** Calls an endpoint and turns what happened, including Next's redirect/forbidden throws, into an outcome. */
export async function invoke(run: () => unknown): Promise<Outcome> {
  try {
    const value = await run();
    if (value instanceof Response) {
      return {
        kind: "response",
        status: value.status,
        body: await value.text(),
        contentType: value.headers.get("content-type") ?? "",
      };
    }
    return {
      kind: "result",
      value: (value ?? {}) as { ok?: boolean; status?: number; message?: unknown },
    };
  } catch (error) {
    const digest = String((error as { digest?: unknown })?.digest ?? "");
    if (digest.startsWith("NEXT_REDIRECT;")) return { kind: "redirect", to: digest.split(";")[2] };
    if (digest === "NEXT_HTTP_ERROR_FALLBACK;403") return { kind: "forbidden" };
    return { kind: "threw", error };
  }
}

/** 401 and 403 as the caller sees them; null when the endpoint let the caller through. */
export function refusal(o: Outcome): 401 | 403 | null {
  if (
    o.kind === "result" &&
    o.value.ok === false &&
    (o.value.status === 401 || o.value.status === 403)
  )
    return o.value.status;
  if (o.kind === "response" && (o.status === 401 || o.status === 403)) return o.status;
  if (o.kind === "redirect" && o.to === "/sign-in") return 401;
  if (o.kind === "forbidden") return 403;
  return null;
}

export const describeOutcome = (o: Outcome) =>
  o.kind === "threw"
    ? `threw ${String((o.error as Error)?.stack ?? o.error)}`
    : JSON.stringify(o).slice(0, 400);

/** Row counts of every table, from sqlite_master, in one statement. */
export async function tableCounts(client: Client): Promise<Record<string, number>> {
  const tables = await client.execute(
    "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name",
  );
  const sql = tables.rows
    .map((r) => `SELECT '${String(r.name)}' AS t, count(*) AS n FROM "${String(r.name)}"`)
    .join(" UNION ALL ");
  const rows = (await client.execute(sql)).rows;
  return Object.fromEntries(rows.map((r) => [String(r.t), Number(r.n)]));
}

export function changedTables(
  before: Record<string, number>,
  after: Record<string, number>,
): string[] {
  return Object.keys({ ...before, ...after }).filter((t) => before[t] !== after[t]);
}

/** The seeded demo user who holds each role alone, with a read and a read_write API token each. */
export async function peopleByRole(db: Database) {
  const people = {} as Record<
    Role,
    { id: string; name: string; readToken: string; writeToken: string }
  >;
  for (const role of ROLES) {
    const [u] = await db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    const actor = { id: u.id, name: u.name };
    const readToken = (await createApiToken(actor, { name: `${role} read`, scope: "read" })).token;
    const writeToken = (await createApiToken(actor, { name: `${role} write`, scope: "read_write" }))
      .token;
    people[role] = { ...actor, readToken, writeToken };
  }
  return people;
}

/** Makes `cookies()` carry a fresh session of this user (a new one each call: signing out ends it), or none. */
export async function actAs(user: { id: string } | null) {
  setSessionCookie(SESSION_COOKIE, user ? (await createSession(user.id)).token : null);
}

/** A Request to a route file, with its dynamic segments filled in. */
export function routeRequest(
  e: Endpoint,
  init: {
    query?: string;
    headers?: Record<string, string>;
    body?: BodyInit | null;
    params?: Record<string, string>;
  } = {},
) {
  const params = Object.fromEntries(
    e.params.map((p) => [p, init.params?.[p] ?? crypto.randomUUID()]),
  );
  const path = e.file
    .replace(/^app/, "")
    .replace(/\/route\.ts$/, "")
    .replace(/\[(\w+)\]/g, (_, p: string) => encodeURIComponent(params[p]));
  // NextRequest, as Next passes it: some handlers read request.nextUrl.
  const request = new NextRequest(`http://127.0.0.1${path}${init.query ?? ""}`, {
    method: e.method,
    headers: init.headers,
    body: e.method === "GET" ? undefined : init.body,
  });
  return { request, context: { params: Promise.resolve(params) } };
}
