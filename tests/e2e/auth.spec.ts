import { DEMO, expect, signIn, signInAs, test, type DemoRole } from "./fixtures";

const NAV: Record<DemoRole, string[]> = {
  admin: [
    "Plant overview",
    "My queue",
    "Cleaning systems",
    "Parts & specifications",
    "Documents",
    "Changes",
    "Deviations",
    "Evidence",
    "Instruments",
    "Wash cycles & lots",
    "Lab methods",
    "Training",
    "Control plans",
    "Nonconformances",
    "Trace",
    "How we compute",
    "Admin",
  ],
  engineer: [
    "Plant overview",
    "My queue",
    "Cleaning systems",
    "Parts & specifications",
    "Documents",
    "Changes",
    "Deviations",
    "Evidence",
    "Instruments",
    "Wash cycles & lots",
    "Lab methods",
    "Training",
    "Control plans",
    "Nonconformances",
    "Trace",
    "How we compute",
  ],
  reviewer: [
    "Plant overview",
    "My queue",
    "Cleaning systems",
    "Parts & specifications",
    "Documents",
    "Changes",
    "Deviations",
    "Evidence",
    "Instruments",
    "Wash cycles & lots",
    "Lab methods",
    "Training",
    "Control plans",
    "Nonconformances",
    "Trace",
    "How we compute",
  ],
  approver: [
    "Plant overview",
    "My queue",
    "Cleaning systems",
    "Parts & specifications",
    "Documents",
    "Changes",
    "Deviations",
    "Evidence",
    "Instruments",
    "Wash cycles & lots",
    "Lab methods",
    "Training",
    "Control plans",
    "Nonconformances",
    "Trace",
    "How we compute",
  ],
  technician: [
    "Plant overview",
    "My queue",
    "Cleaning systems",
    "Parts & specifications",
    "Documents",
    "Deviations",
    "Evidence",
    "Instruments",
    "Wash cycles & lots",
    "Lab methods",
    "Training",
    "Control plans",
    "Nonconformances",
    "How we compute",
  ],
  auditor: [
    "Plant overview",
    "Cleaning systems",
    "Parts & specifications",
    "Documents",
    "Changes",
    "Deviations",
    "Evidence",
    "Instruments",
    "Wash cycles & lots",
    "Lab methods",
    "Training",
    "Control plans",
    "Nonconformances",
    "Trace",
    "How we compute",
  ],
};

for (const role of Object.keys(DEMO) as DemoRole[]) {
  test(`${role} signs in and sees the ${role}'s navigation`, async ({ page }) => {
    await signInAs(page, role);
    const links = page.getByRole("navigation", { name: "Main" }).getByRole("link");
    await expect(links).toHaveText(NAV[role]);
  });
}

test("a wrong password shows the generic error and keeps the e-mail", async ({ page }) => {
  await signIn(page, DEMO.reviewer.email, "not-the-password");
  const alert = page.getByRole("form", { name: "Sign in" }).getByRole("alert");
  await expect(alert).toHaveText(/e-mail or password is not correct/);
  await expect(page.getByLabel("E-mail")).toHaveValue(DEMO.reviewer.email);
  await expect(page.getByLabel("Password")).toHaveValue("");
  // An unknown e-mail gets exactly the same message.
  const first = await alert.textContent();
  await page.getByLabel("E-mail").fill("nobody@fennmoor.example");
  await page.getByLabel("Password").fill("whatever it is");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByLabel("E-mail")).toHaveValue("nobody@fennmoor.example");
  await expect(alert).toHaveText(first!);
});

test("a sign-in sent before the page's script runs never puts the password in the address", async ({
  browser,
}) => {
  const context = await browser.newContext({ javaScriptEnabled: false });
  const page = await context.newPage();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(DEMO.reviewer.email);
  await page.getByLabel("Password").fill("a password typed early");
  await page.getByLabel("Password").press("Enter");
  await page.waitForLoadState();
  expect(page.url()).not.toContain("password");
  expect(page.url()).not.toContain("typed");
  await context.close();
});

test("empty sign-in fields get their own errors beside them", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByText("Enter your e-mail address.")).toBeVisible();
  await expect(page.getByText("Enter your password.")).toBeVisible();
});

test("sign-out ends the session on the server", async ({ page, context }) => {
  await signInAs(page, "engineer");
  const cookie = (await context.cookies()).find((c) => c.name === "washproof_session");
  expect(cookie).toBeDefined();
  await page.getByText(DEMO.engineer.name).click();
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/sign-in$/);
  // Replaying the old cookie does not bring the session back.
  await context.addCookies([cookie!]);
  await page.goto("/queue");
  await expect(page).toHaveURL(/\/sign-in$/);
});

test("an auditor who opens an admin URL is refused by the server", async ({ page }) => {
  await signInAs(page, "auditor");
  const response = await page.goto("/admin");
  expect(response?.status()).toBe(403);
  await expect(
    page.getByRole("heading", { name: "Your role does not open this page" }),
  ).toBeVisible();
  const create = await page.goto("/admin/users/new");
  expect(create?.status()).toBe(403);
});

test("a signed-out visitor is sent to sign-in", async ({ page }) => {
  await page.goto("/systems");
  await expect(page).toHaveURL(/\/sign-in$/);
});
