import { expect, signInAs, test } from "./fixtures";

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
  await expect(page.getByLabel("Change request (optional)").locator("option:checked")).toHaveText(
    /^CR-2026-002 · /,
  );
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
