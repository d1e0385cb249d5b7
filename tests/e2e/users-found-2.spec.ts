import type { Browser, Page } from "@playwright/test";
import { DEMO_PASSWORD, expect, signInAs, test, type DemoRole } from "./fixtures";

async function as(browser: Browser, role: DemoRole, url: string) {
  const page = await (await browser.newContext()).newPage();
  await signInAs(page, role);
  await page.goto(url);
  return page;
}

// Second round of what users found (issue #18): one test per screen item.

test("during requalification the engineer's next step opens a run for the missing evidence, filled in from the change", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  await page.goto("/changes");
  await page.getByRole("link", { name: "CR-2026-002" }).click();
  const next = page.getByRole("region", { name: "Next step" });
  await expect(next.getByRole("button", { name: "Verify change" })).toHaveCount(0);
  await next
    .getByRole("list", { name: "Enter the evidence" })
    .getByRole("link", { name: "Open a particle cleanliness run for CR-2026-002" })
    .click();
  await expect(page.getByRole("heading", { name: "New test run" })).toBeVisible();
  await expect(page.getByLabel("Test type")).toHaveValue("particle_cleanliness");
  await expect(
    page.getByLabel("Change request (optional)", { exact: true }).locator("option:checked"),
  ).toHaveText(/^CR-2026-002 · /);
  await expect(page.getByLabel("Recipe version").locator("option:checked")).toHaveText(
    /\(proposed\)$/,
  );
  await expect(page.getByLabel("Requirement of the change request (optional)")).toHaveValue(
    "Particle cleanliness on 29 parts",
  );
});

test("the audit trail names records by number and name and shows values in words, not ids and JSON", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  await page.goto("/trace/audit?eventType=test_run.created");
  const table = page.getByRole("table", { name: "Audit events, newest first" });
  await expect(table).toContainText("TR-0001 · Particle cleanliness on PF-VB-210", {
    timeout: 30_000,
  });
  await expect(table).toContainText("Part family: PF-VB-210 · Valve body VB-210");
  await expect(table).toContainText("Technician: Ravi Menon");
  await expect(table).not.toContainText(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-/);

  await page.goto("/trace/audit?eventType=change.opened");
  await expect(table).toContainText("CR-2025-001 · Raise valve-body wash temperature to 60 °C", {
    timeout: 30_000,
  });
  await expect(table).not.toContainText("{");
});

test("a validation report opens with report wording and the results of the runs on its part family and recipe version", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  await page.goto("/documents/new");
  await page.getByLabel("Kind of document").selectOption({ label: "Validation report" });
  await page.getByLabel("Title").fill("First PQ report, valve bodies");
  await page
    .getByLabel("Cleaning system")
    .selectOption({ label: "AW-3 — Three-tank aqueous washer" });
  await page.getByLabel("Part family").selectOption({ label: "PF-VB-210 — Valve body VB-210" });
  await page
    .getByLabel("Recipe version")
    .selectOption({ label: "R-AW3-VB version 1 (superseded) — Valve body, ultrasonic" });
  await page.getByRole("button", { name: "Create draft from template" }).click();
  const editor = page.getByRole("textbox", { name: "Document text" });
  await expect(editor).toContainText("It records the runs performed");
  await expect(editor).not.toContainText("before the first run");
  await expect(editor).toContainText("TR-0001 (");
});

test("on the second round the reviewer sees what changed since sending it back; the author sees the comment and the reviewers are remembered", async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  await signInAs(page, "engineer");
  await page.goto("/documents/new");
  await page.getByLabel("Kind of document").selectOption({ label: "Procedure" });
  await page.getByLabel("Title").fill("Loading the spray-washer basket");
  await page.getByRole("button", { name: "Create draft from template" }).click();
  const editor = page.getByRole("textbox", { name: "Document text" });
  await editor.getByText("Record the result.", { exact: true }).click();
  await page.keyboard.press("End");
  await page.keyboard.type(" Load ten parts per layer.");
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();
  await page.getByRole("link", { name: "Back to the document" }).click();
  await page.waitForURL(/\/documents\/[^/?]+(\?.*)?$/);
  const documentUrl = page.url();

  await page.getByRole("button", { name: "Submit for review" }).click();
  let dialog = page.getByRole("dialog");
  await dialog.getByRole("checkbox", { name: /Tomas Brandt/ }).check();
  await dialog.getByLabel("Approver").selectOption({ label: "Helena Okafor (Quality manager)" });
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByRole("region", { name: "Routing" })).toContainText("Tomas Brandt");

  const reviewer = await as(browser, "reviewer", documentUrl);
  const sendBack = reviewer.getByRole("form", { name: "Send back" });
  await sendBack.getByLabel("What must change").fill("Say which layer is the worst case.");
  await sendBack.getByRole("button", { name: "Send back" }).click();
  await expect(reviewer.getByRole("region", { name: "Routing" })).toContainText("Sent back");

  // The author edits with the comment in view.
  await page.goto(documentUrl.replace(/\?.*$/, "") + "/edit");
  await expect(page.getByRole("region", { name: "Returned with comments" })).toContainText(
    "Say which layer is the worst case.",
  );
  await editor.getByText(/Load ten parts per layer\./).click();
  await page.keyboard.press("End");
  await page.keyboard.type(" The lowest layer is the worst case.");
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();
  await page.getByRole("link", { name: "Back to the document" }).click();

  // Resubmitting starts from the last round's reviewer and approver.
  await page.getByRole("button", { name: "Submit for review" }).click();
  dialog = page.getByRole("dialog");
  await expect(dialog.getByRole("checkbox", { name: /Tomas Brandt/ })).toBeChecked();
  await expect(dialog.getByLabel("Approver")).not.toHaveValue("");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByRole("region", { name: "Version 1" })).toContainText("In review");

  await reviewer.reload();
  const changed = reviewer.getByRole("region", { name: "Changed since round 1" });
  await expect(changed).toContainText("Say which layer is the worst case.");
  await expect(changed.getByTestId("redline").locator("ins")).toContainText(
    "The lowest layer is the worst case.",
  );
});

test("two tabs: after the other tab saves again, Save my text over theirs says so and then saves over the newest text", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  await page.goto("/documents/new");
  await page.getByLabel("Kind of document").selectOption({ label: "Procedure" });
  await page.getByLabel("Title").fill("Two tabs on the rinse procedure");
  await page.getByRole("button", { name: "Create draft from template" }).click();
  await expect(page).toHaveURL(/\/edit/);
  const tabB = await page.context().newPage();
  await tabB.goto(page.url());

  const type = async (tab: typeof page, text: string) => {
    await tab
      .getByRole("textbox", { name: "Document text" })
      .getByText(/^Record the result\./)
      .click();
    await tab.keyboard.press("End");
    await tab.keyboard.type(text);
  };
  await type(page, " Tab A.");
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();
  await type(tabB, " Tab B.");
  // The conflict's alert, whose words change with each attempt; Next's route announcer is an alert too.
  const alert = tabB
    .getByRole("alert")
    .filter({ has: tabB.getByRole("button", { name: "Save my text over theirs" }) });
  await expect(alert).toContainText("Someone saved this draft after you opened it.");
  await type(page, " Tab A again.");
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();

  await alert.getByRole("button", { name: "Save my text over theirs" }).click();
  await expect(alert).toContainText("They saved again at");
  await alert.getByRole("button", { name: "Save my text over theirs" }).click();
  await expect(tabB.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();
  await page.reload();
  await expect(page.getByRole("textbox", { name: "Document text" })).toContainText("Tab B.");
});

test("the CSV column-matching panel stays open for review after the last column is matched, until the import", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/runs/new");
  await page.getByLabel("Part family").selectOption({ label: "PF-VB-210 · Valve body VB-210" });
  // Whichever valve-body version is in force (another spec may have made a later one effective).
  const inForce = await page
    .getByLabel("Recipe version")
    .locator("option", { hasText: /^R-AW3-VB v\d+ \(effective\)$/ })
    .textContent();
  await page.getByLabel("Recipe version").selectOption({ label: inForce! });
  await page.getByLabel("Test type").selectOption({ label: "Gravimetric" });
  await page.getByLabel("Analysing lab").fill("Larchfield cleanliness lab");
  await page.getByRole("button", { name: "Open test run" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Gravimetric");

  const importer = page.getByRole("form", { name: "Import filter weighings from CSV" });
  await importer.getByLabel(/^CSV file of/).setInputFiles({
    name: "weighings.csv",
    mimeType: "text/csv",
    buffer: Buffer.from(
      "Part serial,Parts,Weight empty,Weight loaded\nVB-CSV-01,1,12.40,13.61\nVB-CSV-02,1,12.41,13.58\n",
    ),
  });
  const matching = importer.getByRole("group", { name: "Match the file's columns" });
  await expect(matching).toBeVisible();
  await importer.getByLabel("Filter mass before (mg)").selectOption("Weight empty");
  await importer.getByLabel("Filter mass after (mg)").selectOption("Weight loaded");
  // Every column is matched: the panel stays, showing the choices for review.
  await expect(matching).toBeVisible();
  await expect(importer.getByLabel("Filter mass after (mg)")).toHaveValue("Weight loaded");
  await importer.getByRole("button", { name: "Import" }).click();
  await expect(importer.getByRole("status")).toHaveText("2 sample(s) imported from weighings.csv.");
  await expect(matching).toBeHidden();
});

/** The pages the client router fetches (prefetches and navigations), by path. */
function recordRouterFetches(page: Page) {
  const paths: string[] = [];
  page.on("request", (r) => {
    if (r.headers()["rsc"] === "1") paths.push(new URL(r.url()).pathname);
  });
  return paths;
}

test("the API tokens page settles, and menu links are fetched on intent rather than all at load", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  const routerFetches = recordRouterFetches(page);
  // Before, a prefetch of the API description behind a router link never settled.
  await page.goto("/account/tokens", { waitUntil: "networkidle" });
  await expect(page.getByRole("heading", { name: "API tokens" })).toBeVisible();
  expect(routerFetches.filter((p) => p.startsWith("/api/"))).toEqual([]);
  expect(routerFetches).not.toContain("/documents");

  const onHover = page.waitForRequest(
    (r) => r.headers()["rsc"] === "1" && new URL(r.url()).pathname === "/documents",
  );
  await page
    .getByRole("navigation", { name: "Main" })
    .getByRole("link", { name: "Documents" })
    .hover();
  await onHover;
});

test("a list's row links are fetched on intent too: a page of change requests fetches no other page at load", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  const routerFetches = recordRouterFetches(page);
  await page.goto("/changes", { waitUntil: "networkidle" });
  const first = page.getByRole("link", { name: /^CR-\d{4}-\d{3}$/ }).first();
  await expect(first).toBeVisible();
  expect(routerFetches).toEqual([]);
  const target = new URL((await first.getAttribute("href"))!, page.url()).pathname;
  const onHover = page.waitForRequest(
    (r) => r.headers()["rsc"] === "1" && new URL(r.url()).pathname === target,
  );
  await first.hover();
  await onHover;
});
