import { NextRequest } from "next/server";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { revalidatePath } from "next/cache";
import { getDb } from "@/db/client";
import { seedDemo } from "@/db/seed";
import { defineAction } from "@/lib/actions/define-action";
import { arrayFields, readForm } from "@/lib/actions/read-form";
import { appendAudit } from "@/lib/audit";
import { ruleOf } from "@/lib/auth/endpoint-rule";
import { apiRoute, defineRoute } from "@/lib/server/api/handler";
import {
  describeFailure,
  ERROR_KINDS,
  ERROR_STATUS,
  toActionFailure,
  UserFacingError,
} from "@/lib/server/errors";
import { actAs, invoke, peopleByRole } from "./support/endpoints";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: vi.fn(),
}));

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let people: Awaited<ReturnType<typeof peopleByRole>>;

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
});
afterAll(() => t.cleanup());
beforeEach(() => vi.mocked(revalidatePath).mockClear());

const auditCount = async () =>
  Number((await t.client.execute("SELECT count(*) AS n FROM audit_events")).rows[0].n);

function form(fields: Record<string, string | string[]>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) fd.append(k, one);
  return fd;
}

/** A real write: one audited event, in one transaction, as every service does. */
const ran = vi.fn();
async function record(user: { id: string; name: string }, note: string) {
  ran();
  await getDb().transaction((tx) =>
    appendAudit(
      tx,
      { id: user.id, name: user.name },
      {
        eventType: "audit.verified",
        recordType: "audit_trail",
        recordId: "chain",
        new: { ok: true, events: note.length },
      },
    ),
  );
}

const noteAction = defineAction({
  permission: "users.manage",
  input: z.object({
    note: z.string().trim().min(3, "Write at least 3 characters."),
    tags: z.array(z.string()).default([]),
  }),
  run: async ({ user, input }) => {
    if (input.note === "missing")
      throw new UserFacingError("That record does not exist.", {
        kind: "not_found",
        field: "note",
      });
    if (input.note === "crash") throw new Error("SQLITE_CONSTRAINT: secret table detail");
    await record(user, input.note);
    if (input.note === "go away") return { redirect: "/elsewhere" };
    return { message: `Noted with ${input.tags.length} tag(s).`, extra: "kept" };
  },
  revalidate: (input) => [`/notes/${input.note}`, ["/systems", "layout"]],
});

describe("defineAction", () => {
  it("carries its rule for the registry", () => {
    expect(ruleOf(noteAction)).toEqual({ auth: "session", permission: "users.manage" });
    // Forms call it with (previous state, form data); the matrix test relies on the arity.
    expect(noteAction.length).toBe(2);
  });

  it("refuses a signed-out caller and a role without the permission before reading the input, and writes nothing", async () => {
    for (const [who, status] of [
      [null, 401],
      ["technician", 403],
      ["auditor", 403],
    ] as const) {
      await actAs(who ? people[who] : null);
      const before = await auditCount();
      ran.mockClear();
      // An invalid body too: a refused caller must learn nothing from validation.
      const result = await noteAction(null, form({ note: "x" }));
      expect(result).toMatchObject({ ok: false, status });
      expect(result).not.toHaveProperty("fieldErrors");
      expect(ran).not.toHaveBeenCalled();
      expect(await auditCount()).toBe(before);
      expect(revalidatePath).not.toHaveBeenCalled();
    }
  });

  it("keeps field errors for bad input and writes nothing", async () => {
    await actAs(people.admin);
    const before = await auditCount();
    const result = await noteAction(null, form({ note: " a " }));
    expect(result).toEqual({
      ok: false,
      message: "Some fields need attention.",
      fieldErrors: { note: ["Write at least 3 characters."] },
    });
    expect(await auditCount()).toBe(before);
  });

  it("runs, revalidates what it names and returns run's message and extra fields; a list field keeps every value", async () => {
    await actAs(people.admin);
    const before = await auditCount();
    const result = await noteAction(null, form({ note: "calibrated", tags: ["a", "b"] }));
    expect(result).toEqual({ ok: true, message: "Noted with 2 tag(s).", extra: "kept" });
    expect(await auditCount()).toBe(before + 1);
    expect(vi.mocked(revalidatePath).mock.calls).toEqual([
      ["/notes/calibrated"],
      ["/systems", "layout"],
    ]);
  });

  it("maps a user-facing error to its message and field, and hides anything else", async () => {
    await actAs(people.admin);
    expect(await noteAction(null, form({ note: "missing" }))).toEqual({
      ok: false,
      message: "That record does not exist.",
      fieldErrors: { note: ["That record does not exist."] },
    });
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const crashed = await noteAction(null, form({ note: "crash" }));
    expect(crashed).toMatchObject({
      ok: false,
      message: "Something went wrong on the server. Nothing was changed; try again.",
    });
    expect(JSON.stringify(crashed)).not.toMatch(/SQLITE|secret/);
    expect(logged).toHaveBeenCalledTimes(1);
    logged.mockRestore();
    expect(revalidatePath).not.toHaveBeenCalled();
  });

  it("redirects when run asks, after the change is written and the pages revalidated", async () => {
    await actAs(people.admin);
    const before = await auditCount();
    expect(await invoke(() => noteAction(null, form({ note: "go away" })))).toEqual({
      kind: "redirect",
      to: "/elsewhere",
    });
    expect(await auditCount()).toBe(before + 1);
    expect(revalidatePath).toHaveBeenCalledWith("/notes/go away");
  });

  it("refuses a body that is not a form, and a malformed JSON payload, plainly and without throwing", async () => {
    await actAs(people.admin);
    const payloadAction = defineAction({
      permission: "users.manage",
      input: z.object({ rows: z.array(z.number()) }),
      from: "payload",
      run: async () => ({ message: "ok" }),
    });
    expect(await payloadAction(null, form({ payload: "{not json" }))).toEqual({
      ok: false,
      message: "The form could not be read. Reload the page; nothing was saved.",
    });
    expect(
      await payloadAction(null, form({ payload: JSON.stringify({ rows: ["x"] }) })),
    ).toMatchObject({ ok: false, fieldErrors: { "rows.0": [expect.any(String)] } });
    expect(await payloadAction(null, form({ payload: JSON.stringify({ rows: [1, 2] }) }))).toEqual({
      ok: true,
      message: "ok",
    });
    // A key the schema does not know is refused by name, at any depth, never silently dropped.
    const nested = defineAction({
      permission: "users.manage",
      input: z.object({ rows: z.array(z.object({ setpoint: z.number() })) }),
      from: "payload",
      run: async () => ({ message: "ok" }),
    });
    const refused = await nested(
      null,
      form({ payload: JSON.stringify({ rows: [{ setpoint: 1, Setpoint: 2 }] }) }),
    );
    expect(refused).toMatchObject({
      ok: false,
      fieldErrors: { "rows.0.Setpoint": [expect.stringMatching(/did you mean "setpoint"/)] },
    });
    expect(
      await nested(null, form({ payload: JSON.stringify({ rows: [{ setpoint: 1 }] }) })),
    ).toEqual({ ok: true, message: "ok" });
    expect(await noteAction(null, "note=hello" as unknown as FormData)).toMatchObject({
      ok: false,
      message: expect.stringMatching(/could not be read/),
    });
  });

  it("switches permission on a declared field: signing as performed needs evidence.sign_performed, verifying evidence.verify", async () => {
    const sign = defineAction({
      permission: "evidence.verify",
      when: { field: "meaning", value: "performed", permission: "evidence.sign_performed" },
      input: z.object({ meaning: z.enum(["performed", "verified"]) }),
      run: async ({ input }) => ({ message: input.meaning }),
    });
    expect(ruleOf(sign)).toEqual({
      auth: "session",
      permission: "evidence.verify",
      when: { field: "meaning", value: "performed", permission: "evidence.sign_performed" },
    });
    // From the role table (lib/auth/permissions.ts): reviewers verify, only technicians sign as performed.
    await actAs(people.reviewer);
    expect(await sign(null, form({ meaning: "verified" }))).toEqual({
      ok: true,
      message: "verified",
    });
    expect(await sign(null, form({ meaning: "performed" }))).toMatchObject({
      ok: false,
      status: 403,
    });
    await actAs(people.technician);
    expect(await sign(null, form({ meaning: "performed" }))).toEqual({
      ok: true,
      message: "performed",
    });
  });
});

describe("readForm", () => {
  it("nests dotted names, drops files and the framework's fields, and keeps lists only where the schema takes one", () => {
    const schema = z
      .object({
        roles: z.array(z.string()).min(1),
        name: z.string(),
        counts: z.object({ B: z.string() }),
      })
      .refine(() => true);
    expect(arrayFields(schema)).toEqual(["roles"]);
    const fd = form({ roles: "admin", name: "Ada", "counts.B": "14", $ACTION_ID_x: "1" });
    fd.append("name", "second");
    fd.append("upload", new File(["x"], "x.txt"));
    expect(readForm(fd, schema)).toEqual({ roles: ["admin"], name: "second", counts: { B: "14" } });
  });
});

describe("error kinds", () => {
  it("map to HTTP statuses in one table", () => {
    // RFC 9110 §15.5 (403, 404, 409, 413, 422), RFC 4918 §11.3 (423), RFC 9110 §15.6.4 (503).
    expect(ERROR_STATUS).toEqual({
      invalid: 422,
      not_found: 404,
      conflict: 409,
      forbidden: 403,
      locked: 423,
      too_large: 413,
      unavailable: 503,
    });
    for (const kind of ERROR_KINDS)
      expect(describeFailure(new UserFacingError("m", { kind })).status).toBe(ERROR_STATUS[kind]);
  });

  it("default to conflict, and keep the old (message, field) form", () => {
    const e = new UserFacingError("Someone saved it first.", "lockVersion");
    expect(e.kind).toBe("conflict");
    expect(toActionFailure(e)).toEqual({
      ok: false,
      message: "Someone saved it first.",
      fieldErrors: { lockVersion: ["Someone saved it first."] },
    });
  });

  it("turn a busy or read-only database into 503 with a plain message, and anything else into 500", () => {
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const busy = Object.assign(new Error("SQLITE_BUSY: database is locked"), {
      code: "SQLITE_BUSY",
    });
    const readonly = new Error("query failed", {
      cause: Object.assign(new Error("attempt to write a readonly database"), {
        code: "SQLITE_READONLY",
      }),
    });
    for (const e of [busy, readonly]) {
      const f = describeFailure(e);
      expect(f).toMatchObject({ kind: "unavailable", status: 503 });
      expect(f.message).not.toMatch(/SQLITE|readonly database/);
    }
    expect(describeFailure(new Error("boom"))).toMatchObject({ kind: "internal", status: 500 });
    logged.mockRestore();
  });
});

describe("defineRoute", () => {
  const route = defineRoute<{ id: string }>(
    { permission: "audit.export" },
    async ({ user, params }) => {
      if (params.id === "missing")
        throw new UserFacingError("No such thing.", { kind: "not_found" });
      if (params.id === "locked") throw new UserFacingError("It is locked.", { kind: "locked" });
      if (params.id === "busy")
        throw Object.assign(new Error("SQLITE_BUSY"), { code: "SQLITE_BUSY" });
      await record(user, params.id);
      return Response.json({ ok: true });
    },
  );
  const call = (id: string) =>
    route(new NextRequest("http://127.0.0.1/api/x"), { params: Promise.resolve({ id }) });

  it("carries its rule, refuses signed-out and unpermitted callers with 401/403 and writes nothing", async () => {
    expect(ruleOf(route)).toEqual({ auth: "session", permission: "audit.export" });
    const before = await auditCount();
    await actAs(null);
    expect((await call("a")).status).toBe(401);
    // audit.export: admin and auditor only (lib/auth/permissions.ts).
    await actAs(people.approver);
    const refused = await call("a");
    expect(refused.status).toBe(403);
    expect(await refused.json()).toEqual({ error: "Your role does not allow this." });
    expect(await auditCount()).toBe(before);
  });

  it("answers each kind with its status, and lets a permitted caller through", async () => {
    await actAs(people.auditor);
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    expect((await call("missing")).status).toBe(404);
    expect((await call("locked")).status).toBe(423);
    const busy = await call("busy");
    expect(busy.status).toBe(503);
    expect(JSON.stringify(await busy.json())).not.toMatch(/SQLITE/);
    logged.mockRestore();
    const before = await auditCount();
    expect((await call("fine")).status).toBe(200);
    expect(await auditCount()).toBe(before + 1);
  });
});

describe("apiRoute", () => {
  it("declares its token rule and answers a service's refusal by its kind, not always 409", async () => {
    const route = apiRoute<{ kind: string }>(
      { permission: "evidence.view", scope: "read" },
      async ({ params }) => {
        throw new UserFacingError("Refused.", { kind: params.kind as "locked" });
      },
    );
    expect(ruleOf(route)).toEqual({ auth: "token", permission: "evidence.view", scope: "read" });
    await actAs(null);
    const call = (kind: string) =>
      route(
        new Request("http://127.0.0.1/api/v1/x", {
          headers: { authorization: `Bearer ${people.technician.readToken}` },
        }),
        { params: Promise.resolve({ kind }) },
      );
    for (const kind of ["not_found", "locked", "too_large", "invalid", "conflict"] as const) {
      const res = await call(kind);
      expect(res.status, kind).toBe(ERROR_STATUS[kind]);
      expect(await res.json()).toEqual({ error: "Refused." });
    }
  });
});
