import { expect, signInAs, test } from "./fixtures";

test("pages carry a nonce-based content security policy, refuse framing and are not cached", async ({
  page,
}) => {
  const response = await page.goto("/sign-in");
  const headers = response!.headers();
  const csp = headers["content-security-policy"];
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(headers["x-frame-options"]).toBe("DENY");
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["cache-control"]).toContain("no-store");
  expect(headers["x-powered-by"]).toBeUndefined();
  // The policy does not break the app: the form still works (scripts carry the nonce).
  await signInAs(page, "engineer");
});

test("the session cookie is httpOnly and SameSite=Lax", async ({ page, context }) => {
  await signInAs(page, "technician");
  const cookie = (await context.cookies()).find((c) => c.name === "washproof_session");
  expect(cookie).toMatchObject({ httpOnly: true, sameSite: "Lax" });
});

test("a new session id is issued at every sign-in", async ({ page, context }) => {
  await signInAs(page, "reviewer");
  const first = (await context.cookies()).find((c) => c.name === "washproof_session")?.value;
  await context.clearCookies();
  await signInAs(page, "reviewer");
  const second = (await context.cookies()).find((c) => c.name === "washproof_session")?.value;
  expect(first).toBeTruthy();
  expect(second).not.toBe(first);
});

test("a session cookie planted before sign-in is never adopted: the planted id opens nothing and sign-in issues a fresh one", async ({
  page,
  context,
  baseURL,
}) => {
  const planted = "planted-by-someone-else-0123456789";
  await context.addCookies([{ name: "washproof_session", value: planted, url: baseURL! }]);
  await page.goto("/queue");
  await expect(page).toHaveURL(/\/sign-in$/);
  await signInAs(page, "technician");
  const issued = (await context.cookies()).find((c) => c.name === "washproof_session")?.value;
  expect(issued).toBeTruthy();
  expect(issued).not.toBe(planted);
  // Putting the planted id back does not ride on the technician's sign-in.
  await context.addCookies([{ name: "washproof_session", value: planted, url: baseURL! }]);
  await page.goto("/queue");
  await expect(page).toHaveURL(/\/sign-in$/);
});

test("signed-in pages and API answers are never cached, carry the policy and refuse framing; plain HTTP gets no HSTS", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  for (const path of ["/documents", "/trace/audit", "/evidence"]) {
    const response = await page.goto(path);
    const headers = response!.headers();
    expect(headers["cache-control"], path).toContain("no-store");
    expect(headers["content-security-policy"], path).toContain("frame-ancestors 'none'");
    expect(headers["content-security-policy"], path).not.toContain("unsafe-eval");
    expect(headers["x-frame-options"], path).toBe("DENY");
    // [derived] the e2e server runs on http://127.0.0.1: HSTS there would pin a plain-HTTP host.
    expect(headers["strict-transport-security"], path).toBeUndefined();
  }
  for (const path of ["/api/audit-events", "/api/evidence/runs", "/api/queue"]) {
    const response = await page.request.get(path);
    expect(response.status(), path).toBeLessThan(500);
    expect(response.headers()["cache-control"], path).toContain("no-store");
    expect(response.headers()["x-content-type-options"], path).toBe("nosniff");
  }
});
