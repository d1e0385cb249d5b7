import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { seedDemo } from "@/db/seed";
import { API_OPERATIONS, endpointKey } from "@/lib/api/openapi";
import { ruleOf } from "@/lib/auth/endpoint-rule";
import { ENDPOINTS, type EndpointRule } from "@/lib/auth/endpoints";
import { PERMISSIONS, ROLES, type Permission, type Role } from "@/lib/auth/permissions";
import {
  actAs,
  changedTables,
  describeOutcome,
  discoverEndpoints,
  invoke,
  peopleByRole,
  refusal,
  routeRequest,
  tableCounts,
  type Endpoint,
} from "./support/endpoints";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
// Mail goes out after the response in Next; here nothing is sent.
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: vi.fn(),
}));

const endpoints = await discoverEndpoints();

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let people: Awaited<ReturnType<typeof peopleByRole>>;

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
});
afterAll(() => t.cleanup());

type Caller = { role: Role | null; token?: "read" | "write" };

/** What the registry and the role table say this caller must get: a 401, a 403, or through (null). */
function expected(
  rule: EndpointRule,
  permission: Permission | null,
  caller: Caller,
): 401 | 403 | null {
  if (rule.auth === "public") return null;
  if (!caller.role) return 401;
  if (rule.auth === "token" && rule.scope === "read_write" && caller.token === "read") return 403;
  return (PERMISSIONS[permission!] as readonly Role[]).includes(caller.role) ? null : 403;
}

/** The inputs that pick which permission applies: empty, plus the switching field when the rule has one. */
function variants(
  rule: EndpointRule,
): { permission: Permission | null; fields: Record<string, string> }[] {
  if (rule.auth === "public") return [{ permission: null, fields: {} }];
  const base = { permission: rule.permission, fields: {} };
  return rule.auth === "session" && rule.when
    ? [base, { permission: rule.when.permission, fields: { [rule.when.field]: rule.when.value } }]
    : [base];
}

function call(e: Endpoint, fields: Record<string, string>, caller: Caller) {
  if (e.kind === "route") {
    const person = caller.role ? people[caller.role] : null;
    const headers: Record<string, string> =
      person && caller.token
        ? {
            authorization: `Bearer ${caller.token === "read" ? person.readToken : person.writeToken}`,
          }
        : {};
    const { request, context } = routeRequest(e, { headers });
    return e.fn(request, context);
  }
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  if (e.fn.length === 0) return e.fn();
  if (e.fn.length === 1) return e.fn(fields);
  return e.fn(null, form);
}

describe("the endpoint registry", () => {
  it("names every action and route handler on disk, and nothing that is not there", () => {
    const onDisk = endpoints.map((e) => e.key).sort();
    const registered = Object.keys(ENDPOINTS).sort();
    // Each endpoint carries its own rule (defineAction, defineRoute, apiRoute …); the registry only collects them.
    expect(
      endpoints.filter((e) => ruleOf(e.fn) === undefined).map((e) => e.key),
      "endpoints that declare no rule",
    ).toEqual([]);
    for (const e of endpoints) expect(ENDPOINTS[e.key], e.key).toBe(ruleOf(e.fn));
    expect(
      onDisk.filter((k) => !registered.includes(k)),
      "endpoints that declare no rule, or whose file is missing from ENDPOINT_MODULES",
    ).toEqual([]);
    expect(
      registered.filter((k) => !onDisk.includes(k)),
      "registry entries with no endpoint",
    ).toEqual([]);
    // [derived] 41 exports of actions.ts and 21 route handler methods at the time of writing
    expect(onDisk.length).toBeGreaterThanOrEqual(62);
  });

  it("and the published API description covers exactly its token endpoints", () => {
    const described = API_OPERATIONS.map(endpointKey).sort();
    const tokenEndpoints = Object.entries(ENDPOINTS)
      .filter(([, rule]) => rule.auth === "token")
      .map(([key]) => key)
      .sort();
    expect(described).toEqual(tokenEndpoints);
  });
});

describe("every endpoint, called as every role and signed out, answers as the role table says", () => {
  it.each(endpoints.map((e) => [e.key, e] as const))("%s", async (_key, e) => {
    const rule = ENDPOINTS[e.key];
    expect(rule, "registered").toBeDefined();
    const callers: Caller[] =
      rule.auth === "token"
        ? [
            { role: null },
            ...ROLES.flatMap((role) => [
              { role, token: "write" as const },
              { role, token: "read" as const },
            ]),
          ]
        : [{ role: null }, ...ROLES.map((role) => ({ role }))];
    for (const { permission, fields } of variants(rule)) {
      for (const caller of callers) {
        await actAs(caller.role && rule.auth !== "token" ? people[caller.role] : null);
        const before = await tableCounts(t.client);
        const outcome = await invoke(() => call(e, fields, caller));
        const label = `${caller.role ?? "signed out"}${caller.token ? ` (${caller.token} token)` : ""} ${JSON.stringify(fields)}: ${describeOutcome(outcome)}`;
        expect(outcome.kind, label).not.toBe("threw");
        // Signing out ends at the sign-in page for everyone; for a public endpoint that is its answer, not a refusal.
        const refused =
          rule.auth === "public" && outcome.kind === "redirect" ? null : refusal(outcome);
        expect(refused, label).toBe(expected(rule, permission, caller));
        if (refused)
          expect(
            changedTables(before, await tableCounts(t.client)),
            `refused but wrote: ${label}`,
          ).toEqual([]);
      }
    }
  });
});
