import { expect, signInAs, test } from "./fixtures";

test.describe.configure({ timeout: 120_000 });

test("a cycle out of its validated range opens a nonconformance that the lot's history names", async ({
  page,
}) => {
  // Unique per attempt: a retry must not meet its own cycle ids as duplicates.
  const tag = Date.now().toString(36).toUpperCase();
  const lot = `E2E-NC-${tag}`;
  const at = (hoursAgo: number) =>
    new Date(Date.now() - hoursAgo * 3_600_000).toISOString().slice(0, 16).replace("T", " ");
  // R-AW3-VB validates the wash at 50–65 °C (demo data): 70 °C flags the cycle.
  const log = [
    "cycle,system,recipe,part_family,lots,baskets,start,end,operator,wash.temperature,wash.time,drying.temperature",
    `AW3-${tag}-H,AW-3,R-AW3-VB,PF-VB-210,${lot},2,${at(3)},${at(2.4)},E2E operator,70,240,110`,
  ].join("\n");

  await signInAs(page, "technician");
  await page.goto("/cycles/import");
  const importer = page.getByRole("form", { name: "Import a cycle log from CSV" });
  await importer
    .getByLabel("Cycle log (CSV)")
    .setInputFiles({ name: "aw3-hot.csv", mimeType: "text/csv", buffer: Buffer.from(log) });
  // Every column is named as the importer expects, so there is nothing to match by hand.
  await importer.getByRole("button", { name: "Import" }).click();
  await expect(importer.getByRole("status")).toContainText("1 cycle(s) imported from aw3-hot.csv");

  await page.goto(`/lots/${lot}`);
  await expect(page.getByRole("heading", { name: `Lot ${lot}` })).toBeVisible();
  const ncs = page.getByRole("table", { name: "Nonconformances naming this lot" });
  await expect(ncs).toContainText(`AW-3 cycle AW3-${tag}-H outside its validated range`);
  await ncs
    .getByRole("link", { name: /^NC-\d{4}-\d{3}$/ })
    .first()
    .click();
  await expect(page).toHaveURL(/\/nonconformances\/[^/]+$/);
  await expect(
    page.getByRole("heading", { name: new RegExp(`AW-3 cycle AW3-${tag}-H outside`) }),
  ).toBeVisible();
});

test("a tank page counts the wash cycles its bath has run since the charge", async ({ page }) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/bath");
  await page.getByRole("link", { name: "SC-1 · Spray wash" }).click();
  await expect(page.getByText(/; \d+ wash cycles? since\./)).toBeVisible();
  await expect(page.getByText("wash cycles not counted yet")).toHaveCount(0);
});
