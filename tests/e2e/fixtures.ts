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

/**
 * Every test's page fails its test when React had to throw away the server's HTML and render the
 * page again in the browser (a hydration mismatch, React error 418 in a production build): the
 * page works, but flickers, loses what was typed before it ran, and costs a second render.
 */
export const test = base.extend({
  page: async ({ page }, provide) => {
    const mismatches: string[] = [];
    const note = (text: string) => {
      if (/Hydration failed|Minified React error #4(18|19|23|25)\b/.test(text))
        mismatches.push(`${page.url()}: ${text.slice(0, 300)}`);
    };
    page.on("pageerror", (error) => note(error.message));
    page.on("console", (message) => {
      if (message.type() === "error") note(message.text());
    });
    await provide(page);
    expect(mismatches, "the server's HTML did not match the browser's first render").toEqual([]);
  },
});
export { expect };
