import { expect, signInAs, test } from "./fixtures";

test("pages carry a nonce-based content security policy, refuse framing and are not cached", async ({ page }) => {
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
