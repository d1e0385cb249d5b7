import { expect, signInAs, test } from "./fixtures";

test("a bath reading beyond its reject limit is graded in words and raises its item in My queue", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/bath");
  await page.getByRole("link", { name: "SC-1 · Spray wash" }).click();

  // The demo plan cites the recipe in force and sets pH reject limits of 6.5–9.5.
  const plan = page.getByRole("table", { name: "Measurement plan" });
  await expect(plan.getByRole("row", { name: /pH/ })).toContainText("R-SC1-SF");

  const form = page.getByRole("form", { name: "Record in the bath log" });
  await form.getByLabel("pH", { exact: true }).fill("10.2");
  await form.getByRole("button", { name: "Record" }).click();
  await expect(form.getByRole("status")).toContainText("Recorded in the bath log.");
  await expect(page.getByRole("status", { name: "Latest graded reading" })).toContainText(
    "Beyond reject limit",
  );

  await page.goto("/queue");
  const row = page
    .getByRole("table", { name: "Waiting for you" })
    .getByRole("row")
    .filter({ hasText: "Bath beyond reject limit (flagged)" })
    .filter({ hasText: "SC-1 · Spray wash" });
  await expect(row).toContainText("pH 10.2 is above the reject limit 9.5");
  await row.getByRole("link", { name: "SC-1 · Spray wash" }).click();
  await expect(page.getByRole("heading", { name: "SC-1 · Spray wash" })).toBeVisible();
});

test("a titration is refused without a positive volume, beside its field, keeping what was typed", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/bath");
  await page.getByRole("link", { name: "SC-1 · Spray wash" }).click();
  const form = page.getByRole("form", { name: "Record in the bath log" });
  await form.getByLabel("Titrant volume (mL)").fill("-2");
  await form.getByLabel("Notes").fill("Second sample");
  await form.getByRole("button", { name: "Record" }).click();
  await expect(form.getByText("Titrant volume (mL) must be at least 0.")).toBeVisible();
  await expect(form.getByLabel("Notes")).toHaveValue("Second sample");
});
