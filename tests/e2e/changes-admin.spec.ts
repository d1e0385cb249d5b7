import { expect, signInAs, test } from "./fixtures";

test("an administrator saves the requalification matrix as a new version; bad values keep what was typed", async ({
  page,
}) => {
  await signInAs(page, "admin");
  await page.goto("/admin/matrix");
  await expect(page.getByRole("heading", { name: "Requalification matrix" })).toBeVisible();
  await page.getByRole("button", { name: "Add row" }).click();
  const rows = page.getByRole("table", { name: "Matrix rows" }).getByRole("row");
  const n = (await rows.count()) - 1;
  await page
    .getByLabel(`Subject of row ${n}`)
    .selectOption({ label: "Parameter: filter interval" });
  await page.getByLabel(`Test of row ${n}`).selectOption({ label: "Gravimetric residue" });
  await page.getByLabel(`Reliability of row ${n}`).fill("100");
  await page.getByRole("button", { name: "Save as new version" }).click();
  await expect(page.getByText("Reliability below 100 %.")).toBeVisible();
  await expect(page.getByLabel(`Reliability of row ${n}`)).toHaveValue("100");

  await page.getByLabel(`Reliability of row ${n}`).fill("95");
  await expect(rows.nth(n)).toContainText("59 parts");
  await page
    .getByLabel("What changed and why")
    .fill("Filter interval changes also need a gravimetric check");
  await page.getByRole("button", { name: "Save as new version" }).click();
  await expect(page.getByText(/Saved as version 2/)).toBeVisible();
  await expect(page.getByRole("region", { name: "Versions" })).toContainText(
    "Version 1 · Superseded",
  );
});
