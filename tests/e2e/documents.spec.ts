import { execFileSync } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { Browser, Page } from "@playwright/test";
import { DEMO, DEMO_PASSWORD, expect, signInAs, test, type DemoRole } from "./fixtures";

async function as(browser: Browser, role: DemoRole) {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signInAs(page, role);
  return page;
}

async function createFromTemplate(page: Page, title: string) {
  await page.goto("/documents");
  await page.getByRole("link", { name: "New document" }).click();
  await page.getByLabel("Kind of document").selectOption({ label: "PQ protocol" });
  await page.getByLabel("Title").fill(title);
  await page
    .getByLabel("Cleaning system")
    .selectOption({ label: "AW-3 — Three-tank aqueous washer" });
  await page.getByLabel("Part family").selectOption({ label: "PF-VB-210 — Valve body VB-210" });
  // The change-control spec may have made a later valve-body version effective meanwhile: take whichever is in force.
  const inForce = await page
    .getByLabel("Recipe version")
    .locator("option", { hasText: /^R-AW3-VB version \d+ \(effective\) — Valve body, ultrasonic$/ })
    .textContent();
  await page.getByLabel("Recipe version").selectOption({ label: inForce! });
  await page.getByRole("button", { name: "Create draft from template" }).click();
  await expect(page).toHaveURL(/\/documents\/[0-9a-f-]+\/edit/);
  const editor = page.getByRole("textbox", { name: "Document text" });
  await expect(editor).toBeVisible();
  return editor;
}

async function downloadPdfText(page: Page) {
  const [download] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("link", { name: "Download PDF" }).click(),
  ]);
  const file = join(mkdtempSync(join(tmpdir(), "washproof-pdf-")), download.suggestedFilename());
  await download.saveAs(file);
  return execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
}

async function signInDialog(page: Page, button: string, password: string) {
  await page.getByRole("button", { name: button }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(password);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  return dialog;
}

test("a PQ protocol goes from template to effective with e-mailed, signed steps and a signed PDF", async ({
  page,
  browser,
}) => {
  test.setTimeout(240_000);
  await signInAs(page, "engineer");
  const editor = await createFromTemplate(page, "PQ of the valve-body recipe on AW-3");
  await expect(editor).toContainText("n = 29 parts");
  await editor.getByText("Sample plan", { exact: true }).click();
  await page.keyboard.press("End");
  await page.keyboard.press("Enter");
  await page.keyboard.type(
    "Worst case: centre of the lowest basket layer. <script>alert('x')</script>",
  );
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();
  await page.getByRole("link", { name: "Back to the document" }).click();

  const content = page.getByRole("article", { name: /PQ-AW3-0001 version 1/ });
  await expect(content).toContainText(
    "Worst case: centre of the lowest basket layer. <script>alert('x')</script>",
  );
  await expect(content.locator("script")).toHaveCount(0);

  await page.getByRole("button", { name: "Submit for review" }).click();
  const submit = page.getByRole("dialog");
  await submit.getByRole("checkbox", { name: /Tomas Brandt/ }).check();
  await submit.getByLabel("Approver").selectOption({ label: "Helena Okafor (Quality manager)" });
  await submit.getByLabel("Your password").fill(DEMO_PASSWORD);
  await submit.getByRole("button", { name: "Sign", exact: true }).click();
  // The signed step re-renders the page: the draft's controls give way to the routing.
  await expect(page.getByRole("region", { name: "Version 1" })).toContainText("In review");
  await expect(page.getByRole("region", { name: "Routing" })).toContainText("Tomas Brandt");

  // The reviewer's request arrives in the demo mailbox, with a link to the version.
  const admin = await as(browser, "admin");
  let link = "";
  await expect(async () => {
    await admin.goto("/admin/email");
    const message = admin
      .getByRole("region", { name: "Demo mailbox" })
      .locator("details", { hasText: "Review requested: PQ-AW3-0001" });
    await expect(message).toContainText(DEMO.reviewer.email, { timeout: 1000 });
    await message.locator("summary").click();
    link = (await message.locator("pre").textContent())!.match(/https?:\/\/\S+/)![0];
  }).toPass({ timeout: 20_000 });

  const reviewer = await as(browser, "reviewer");
  await reviewer.goto(new URL(link).pathname + new URL(link).search);
  const dialog = await signInDialog(reviewer, "Sign as reviewed", "not the password");
  await expect(dialog.getByRole("alert")).toHaveText("One field needs attention: Password.");
  await expect(dialog.getByLabel("Your password")).toHaveAccessibleDescription(
    /The password is not correct\. Nothing was signed\./,
  );
  // The refused password is gone from the box, and the banner's field name leads to it.
  await expect(dialog.getByLabel("Your password")).toHaveValue("");
  await dialog.getByRole("alert").getByRole("button", { name: "Password" }).click();
  await expect(dialog.getByLabel("Your password")).toBeFocused();
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(
    reviewer.getByRole("region", { name: "Routing" }).getByRole("row", { name: /Tomas Brandt/ }),
  ).toContainText("Reviewed");

  const approver = await as(browser, "approver");
  await approver.goto("/queue");
  await approver.getByRole("link", { name: /PQ-AW3-0001 v1/ }).click();
  await signInDialog(approver, "Sign as approved", DEMO_PASSWORD);
  await expect(approver.getByRole("region", { name: "Version 1" })).toContainText("Effective");
  const signatures = approver.getByRole("region", { name: "Signatures" });
  for (const [name, meaning] of [
    [DEMO.engineer.name, "Authored"],
    [DEMO.reviewer.name, "Reviewed"],
    [DEMO.approver.name, "Approved"],
  ]) {
    await expect(
      signatures.getByRole("row", { name: new RegExp(`${meaning} ${name}`) }),
    ).toContainText("Valid");
  }

  const text = await downloadPdfText(approver);
  expect(text).toContain("PQ-AW3-0001");
  for (const [name, meaning] of [
    [DEMO.engineer.name, "Authored"],
    [DEMO.reviewer.name, "Reviewed"],
    [DEMO.approver.name, "Approved"],
  ]) {
    expect(text).toMatch(
      new RegExp(`${name}\\s+${meaning}\\s+\\d{4}-\\d{2}-\\d{2} \\d{2}:\\d{2}:\\d{2} UTC`),
    );
  }
  expect(text).toMatch(/Content hash \(SHA-256\): [0-9a-f]{64}/);
  expect(text).toMatch(/Page 1 of \d+/);
  expect(text).toContain("≤ 400 µm");
  expect(text).not.toContain("UNCONTROLLED COPY");
  await Promise.all([admin, reviewer, approver].map((p) => p.context().close()));
});

test("a stale save is refused with the text kept, an oversized draft is refused, and a draft prints as uncontrolled", async ({
  page,
  browser,
}) => {
  test.setTimeout(240_000);
  await signInAs(page, "engineer");
  const editor = await createFromTemplate(page, "PQ for the concurrency check");
  const editUrl = page.url();

  const other = await (await browser.newContext()).newPage();
  await signInAs(other, "engineer");
  await other.goto(editUrl);
  const otherEditor = other.getByRole("textbox", { name: "Document text" });
  await expect(otherEditor).toBeVisible();

  await editor.getByText("Purpose", { exact: true }).click();
  await page.keyboard.press("End");
  await page.keyboard.type(" (first tab)");
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();

  await otherEditor.getByText("Purpose", { exact: true }).click();
  await other.keyboard.press("End");
  await other.keyboard.type(" (second tab)");
  await expect(other.getByRole("alert").filter({ hasText: "Someone saved" })).toContainText(
    "Someone saved this draft after you opened it. Your text is kept here",
  );
  await expect(otherEditor).toContainText("Purpose (second tab)");

  // An oversized draft: the server refuses it and the text stays in the editor.
  await editor.getByText("Scope", { exact: true }).click();
  await page.keyboard.press("End");
  await page.keyboard.insertText(` ${"rinse ".repeat(380_000)}END-OF-LONG-TEXT`);
  await expect(page.getByRole("alert").filter({ hasText: "MB" })).toContainText(
    "the limit is 2 MB. Nothing was saved and your text is still in the editor",
    { timeout: 90_000 },
  );
  await expect(editor).toContainText("END-OF-LONG-TEXT");

  await other.reload();
  await expect(other.getByRole("textbox", { name: "Document text" })).toContainText(
    "Purpose (first tab)",
  );
  await other.getByRole("link", { name: "Back to the document" }).click();
  const text = await downloadPdfText(other);
  expect(text).toContain("UNCONTROLLED COPY");
  expect(text).toContain("Status: Draft");
  await other.context().close();
});

test("a change narrative is routed through its change request, and its page says so with a link", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  await page.goto("/documents?q=CN-2026-003");
  await page.getByRole("link", { name: "CN-2026-003" }).click();
  const routing = page.getByRole("region", { name: "Routing" });
  await expect(routing).toContainText("Not routed on its own");
  await expect(routing).not.toContainText("Not routed yet");
  await routing.getByRole("link", { name: "CR-2026-003" }).click();
  await expect(page).toHaveTitle(/^CR-2026-003 /);
});
