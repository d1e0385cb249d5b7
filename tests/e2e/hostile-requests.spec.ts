import type { APIResponse, Page } from "@playwright/test";
import { DEMO, expect, signInAs, test } from "./fixtures";

const EVIL = "https://evil.example";
const UNKNOWN = "00000000-0000-4000-8000-000000000000";
const SQL = ["' OR 1=1 --", "%", "_", '"', ";", "\\", "'; drop table users; --"];

/** Nothing about the server's insides leaks: no stack frames, no database messages, no SQL. */
async function expectNoLeak(res: APIResponse, what: string) {
  expect(res.status(), what).toBeLessThan(500);
  const body = await res.text();
  expect(body, what).not.toMatch(/\n\s+at [^\n]+[(:]\d+:\d+\)?/);
  expect(body, what).not.toMatch(/SQLITE|LibsqlError|drizzle/i);
  expect(body, what).not.toMatch(
    /\bselect\s+[\w"*.,\s]+\s+from\b|\binsert into\b|\bwhere\s+"\w+"/i,
  );
  if (!/text\/html/.test(res.headers()["content-type"] ?? ""))
    expect(body, what).not.toMatch(/\b(Type|Range|Syntax|Libsql|Zod)?Error:/);
}

test.describe("requests from another site", () => {
  test("a server action posted with a foreign Origin is refused and the session stays; the same post from here works", async ({
    page,
    context,
  }) => {
    await signInAs(page, "engineer");
    const cookie = (await context.cookies()).find((c) => c.name === "washproof_session")!;
    let captured: { url: string; headers: Record<string, string>; body: string } | undefined;
    await page.route("**/*", async (route) => {
      const r = route.request();
      if (r.method() === "POST" && r.headers()["next-action"]) {
        captured = { url: r.url(), headers: r.headers(), body: r.postData() ?? "" };
        return route.abort();
      }
      return route.continue();
    });
    await page.getByText(DEMO.engineer.name).click();
    await page.getByRole("button", { name: "Sign out" }).click();
    await expect.poll(() => captured).toBeDefined();
    await page.unrouteAll();
    const { url, headers, body } = captured!;
    const forged = await page.request.post(url, {
      headers: { ...headers, origin: EVIL },
      data: body,
      maxRedirects: 0,
    });
    expect(forged.status()).toBe(403);
    await expectNoLeak(forged, "forged action");
    const noOrigin = await page.request.post(url, {
      headers: { ...headers, origin: "", "sec-fetch-site": "cross-site" },
      data: body,
      maxRedirects: 0,
    });
    expect(noOrigin.status()).toBe(403);
    // Still signed in: the forged sign-out did nothing.
    await page.goto("/queue");
    await expect(page).toHaveURL(/\/queue$/);
    // The very same request from our own origin signs out, so the refusal above was the Origin's doing.
    const genuine = await page.request.post(url, { headers, data: body, maxRedirects: 0 });
    expect(genuine.status()).toBeLessThan(400);
    await page.goto("/queue");
    await expect(page).toHaveURL(/\/sign-in$/);
    // The old cookie replayed after sign-out opens nothing: the session is gone on the server.
    await context.addCookies([cookie]);
    expect((await page.request.get("/api/audit-events")).status()).toBe(401);
    expect((await page.request.get("/api/queue")).status()).toBe(401);
  });

  test("the cookie-authenticated upload and import handlers refuse a foreign Origin before they read the body", async ({
    page,
    baseURL,
  }) => {
    await signInAs(page, "technician");
    const multipart = {
      file: {
        name: "report.pdf",
        mimeType: "application/pdf",
        buffer: Buffer.from("%PDF-1.4\n%%EOF\n"),
      },
      kind: "lab_report",
    };
    for (const path of [
      `/api/evidence/runs/${UNKNOWN}/files`,
      `/api/evidence/runs/${UNKNOWN}/import`,
    ]) {
      const forged = await page.request.post(path, { headers: { origin: EVIL }, multipart });
      expect(forged.status(), path).toBe(403);
      expect((await forged.json()).error).toMatch(/another site/);
      const sameSite = await page.request.post(path, {
        headers: { origin: "http://127.0.0.1.evil.example" },
        multipart,
      });
      expect(sameSite.status(), path).toBe(403);
      // From our own origin the handler answers on the merits (no such run, or not a CSV).
      const own = await page.request.post(path, {
        headers: { origin: new URL(baseURL!).origin },
        multipart,
      });
      expect(own.status(), path).not.toBe(403);
      expect(own.status(), path).toBeLessThan(500);
    }
  });

  test("a link on another site to the audit-trail export is refused and writes no export event; the same link from here downloads", async ({
    page,
  }) => {
    await signInAs(page, "auditor");
    const exportPath = "/api/audit-events/export?eventType=audit.exported";
    const exportEvents = async () =>
      (
        await (
          await page.request.get("/api/audit-events?eventType=audit.exported&limit=200")
        ).json()
      ).items.length as number;
    const before = await exportEvents();
    const foreign = await page.request.get(exportPath, {
      headers: { "sec-fetch-site": "cross-site" },
    });
    expect(foreign.status()).toBe(403);
    expect((await foreign.json()).error).toMatch(/another site/);
    expect(await exportEvents()).toBe(before);
    const own = await page.request.get(exportPath, {
      headers: { "sec-fetch-site": "same-origin" },
    });
    expect(own.status()).toBe(200);
    expect(await exportEvents()).toBe(before + 1);
  });
});

test.describe("no server insides in any answer", () => {
  test("unknown ids, bad ids and bad filters get a plain message", async ({ page }) => {
    await signInAs(page, "admin");
    const gets = [
      "/api/audit-events?from=yesterday",
      "/api/audit-events?colour=red",
      "/api/audit-events?before=-1",
      "/api/audit-events/export?limit=abc&x=1",
      "/api/audit-pack/not-a-uuid",
      "/api/trace/parameters?system=not-a-uuid",
      `/api/trace/parameters?q=${"x".repeat(201)}`,
      "/api/trace/parameters?colour=red",
      "/api/trace/recipes?system=not-a-uuid",
      "/api/trace/recipes",
      `/api/audit-pack/${UNKNOWN}`,
      `/api/audit-pack/${UNKNOWN}?format=exe`,
      "/api/documents/not-a-uuid/versions/1/pdf",
      `/api/documents/${UNKNOWN}/versions/1/pdf`,
      `/api/documents/${UNKNOWN}/versions/-1/pdf`,
      `/api/documents/${UNKNOWN}/versions/1e309/pdf`,
      "/api/evidence/files/not-a-uuid",
      `/api/evidence/files/${UNKNOWN}`,
      "/api/evidence/runs?sort=number;drop&dir=sideways&page=-1",
      "/api/evidence/runs?partFamilyId=' OR 1=1 --",
      "/api/evidence/protocols?partFamily=' OR 1=1 --&recipeVersion=x",
      "/api/evidence/protocols",
      "/api/evidence/family-versions?partFamily=' OR 1=1 --",
      "/api/evidence/family-versions",
      "/api/queue?x=%27",
      "/api/v1/recipes",
      "/api/v1/recipes?cursor=abc",
      "/api/v1/openapi.json?x=1",
      `/api/v1/test-runs/${UNKNOWN}`,
      "/documents/not-a-uuid",
      `/documents/${UNKNOWN}`,
      `/documents/${UNKNOWN}/compare?from=x&to=y`,
      "/changes/not-a-uuid",
      `/changes/${UNKNOWN}`,
      "/evidence/runs/not-a-uuid",
      `/evidence/bath/${UNKNOWN}`,
      "/systems/not-a-uuid",
      "/systems/recipes/not-a-uuid",
      "/admin/users/not-a-uuid",
      `/admin/users/${UNKNOWN}`,
      "/trace?recipe=x&key=%27%20OR%201=1",
      "/trace/part-families?family=%27",
    ];
    for (const path of gets)
      await expectNoLeak(await page.request.get(path, { maxRedirects: 0 }), path);
    for (const path of [
      "/api/trace/parameters?system=not-a-uuid",
      `/api/trace/parameters?q=${"x".repeat(201)}`,
      "/api/trace/parameters?colour=red",
    ]) {
      const res = await page.request.get(path);
      expect(res.status(), path).toBe(400);
      expect((await res.json()).error, path).toBe("Some search values are not valid.");
    }
  });

  test("broken bodies on every route that takes one get a plain message", async ({ page }) => {
    await signInAs(page, "technician");
    const posts: [string, Parameters<Page["request"]["post"]>[1]][] = [
      [`/api/evidence/runs/not-a-uuid/files`, { multipart: { kind: "lab_report" } }],
      [
        `/api/evidence/runs/${UNKNOWN}/files`,
        { headers: { "content-type": "multipart/form-data; boundary=x" }, data: "--x\r\nbroken" },
      ],
      [
        `/api/evidence/runs/${UNKNOWN}/files`,
        { headers: { "content-type": "application/json" }, data: "{not json" },
      ],
      [
        `/api/evidence/runs/${UNKNOWN}/files`,
        {
          multipart: {
            file: { name: "a.pdf", mimeType: "application/pdf", buffer: Buffer.from("%PDF-") },
            kind: "virus",
          },
        },
      ],
      [
        `/api/evidence/runs/${UNKNOWN}/files`,
        {
          multipart: {
            file: { name: "a.pdf", mimeType: "application/pdf", buffer: Buffer.from("%PDF-") },
            kind: "lab_report",
          },
        },
      ],
      [
        `/api/evidence/runs/${UNKNOWN}/import`,
        { headers: { "content-type": "multipart/form-data; boundary=x" }, data: "--x\r\nbroken" },
      ],
      [
        `/api/evidence/runs/${UNKNOWN}/import`,
        {
          multipart: {
            file: { name: "c.csv", mimeType: "text/csv", buffer: Buffer.from("sample,B\nS1,1\n") },
            mapping: "{not json",
          },
        },
      ],
      [
        `/api/evidence/runs/${UNKNOWN}/import`,
        {
          multipart: {
            file: { name: "c.csv", mimeType: "text/csv", buffer: Buffer.from("sample,B\nS1,1\n") },
          },
        },
      ],
      [
        `/api/v1/test-runs/${UNKNOWN}/samples`,
        {
          headers: { authorization: "Bearer wpk_forged", "content-type": "application/json" },
          data: "{",
        },
      ],
      // A server action id that does not exist, and a broken action body.
      [
        "/documents",
        {
          headers: { "next-action": "0".repeat(42), "content-type": "text/plain;charset=UTF-8" },
          data: "[",
        },
      ],
    ];
    for (const [path, options] of posts)
      await expectNoLeak(
        await page.request.post(path, { ...options, maxRedirects: 0 }),
        `POST ${path}`,
      );
  });
});

test.describe("SQL metacharacters in every search and filter", () => {
  test("the audit trail, evidence list and their APIs answer normally and never widen the match", async ({
    page,
  }) => {
    await signInAs(page, "admin");
    for (const value of SQL) {
      const q = encodeURIComponent(value);
      for (const field of ["actor", "recordType", "recordId", "eventType"]) {
        const res = await page.request.get(`/api/audit-events?${field}=${q}`);
        expect(res.status(), `${field}=${value}`).toBe(200);
        expect((await res.json()).items, `${field}=${value}`).toEqual([]);
      }
      const page1 = await page.goto(`/trace/audit?eventType=${q}&recordId=${q}`);
      expect(page1?.status()).toBe(200);
      await expect(page.getByRole("main")).toBeVisible();
      for (const field of ["sort", "dir", "testType", "outcome", "partFamilyId", "from"]) {
        const res = await page.request.get(`/api/evidence/runs?${field}=${q}`);
        expect(res.status(), `${field}=${value}`).toBe(400);
        await expectNoLeak(res, `${field}=${value}`);
      }
      const evidence = await page.goto(`/evidence?sort=${q}&testType=${q}&from=${q}`);
      expect(evidence?.status()).toBe(200);
    }
    // A real filter still finds its rows: the event type of the demo's sign-ins.
    const real = await page.request.get("/api/audit-events?eventType=auth.signed_in&limit=5");
    expect(((await real.json()).items as unknown[]).length).toBeGreaterThan(0);
  });

  test("the parameter search matches % and _ literally and finds nothing for SQL", async ({
    page,
  }) => {
    await signInAs(page, "engineer");
    await page.goto("/trace");
    const search = page.getByLabel("Search parameters");
    const results = page.getByRole("list", { name: "Matching parameters" }).getByRole("link");
    const status = page.getByText(/parameters? match|No parameter matches/);
    await search.fill("");
    const all = await results.count();
    for (const value of ["' OR 1=1 --", '"', ";", "\\", "'; drop table"]) {
      await search.fill(value);
      await expect(status).toHaveText("No parameter matches.");
    }
    // "%" is a unit here (detergent concentration), so it matches exactly the parameters in %, not everything.
    await search.fill("%");
    await expect(results.first()).toContainText(/concentration/i);
    expect(await results.count()).toBeLessThan(all);
    await search.fill("_");
    // The server answers the new search after a moment; until then the last list stays.
    await expect(async () => {
      const keys = await results.locator(".font-mono").allTextContents();
      expect(keys.length).toBeGreaterThan(0);
      for (const key of keys) expect(key).toContain("_");
    }).toPass({ timeout: 10_000 });
  });
});
