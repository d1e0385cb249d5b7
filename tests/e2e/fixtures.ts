import { expect, test as base, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "Washproof-demo-2026";

export const DEMO = {
  admin: { email: "admin@fennmoor.example", name: "Priya Castell" },
  engineer: { email: "engineer@fennmoor.example", name: "Ines Varga" },
  reviewer: { email: "reviewer@fennmoor.example", name: "Tomas Brandt" },
  approver: { email: "approver@fennmoor.example", name: "Helena Okafor" },
  technician: { email: "technician@fennmoor.example", name: "Ravi Menon" },
  auditor: { email: "auditor@fennmoor.example", name: "Margit Olsen" },
} as const;

export type DemoRole = keyof typeof DEMO;

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  // A second person on the same page: a signed-in visitor to /sign-in is sent to their queue.
  await page.context().clearCookies();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

export async function signInAs(page: Page, role: DemoRole) {
  await signIn(page, DEMO[role].email);
  await expect(page.getByRole("banner")).toContainText(DEMO[role].name);
}

export const test = base;
export { expect };
