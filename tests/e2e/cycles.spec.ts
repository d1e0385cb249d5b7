import { expect, signInAs, test } from "./fixtures";

test.describe.configure({ timeout: 120_000 });

test("a technician imports a washer's cycle log through the column mapping, and its lot answers", async ({
  page,
}) => {
  // Unique per attempt: a retry must not meet its own cycle ids as duplicates.
  const tag = Date.now().toString(36).toUpperCase();
  const lot = `E2E-${tag}`;
  const at = (hoursAgo: number) =>
    new Date(Date.now() - hoursAgo * 3_600_000).toISOString().slice(0, 16).replace("T", " ");
  // No version column: each cycle runs under the valve-body version in force at its start.
  const log = [
    "Cycle no.,system,recipe,part_family,lots,baskets,start,end,operator,wash.temperature,wash.time",
    `AW3-${tag}-1,AW-3,R-AW3-VB,PF-VB-210,${lot},2,${at(3)},${at(2.4)},E2E operator,60,240`,
    `AW3-${tag}-2,AW-3,R-AW3-VB,PF-VB-210,${lot},2,${at(2)},${at(1.4)},E2E operator,61,240`,
  ].join("\n");

  await signInAs(page, "technician");
  await page.goto("/cycles");
  await page.getByRole("link", { name: "Import a cycle log" }).click();
  const importer = page.getByRole("form", { name: "Import a cycle log from CSV" });
  await importer
    .getByLabel("Cycle log (CSV)")
    .setInputFiles({ name: "aw3-log.csv", mimeType: "text/csv", buffer: Buffer.from(log) });
  await expect(importer.getByRole("group", { name: "Match the file's columns" })).toBeVisible();
  await importer.getByLabel("Cycle id", { exact: true }).selectOption("Cycle no.");
  await importer.getByRole("button", { name: "Import" }).click();
  await expect(importer.getByRole("status")).toContainText("2 cycle(s) imported from aw3-log.csv");

  await page.goto("/lots");
  await page.getByLabel("Lot number starts with").fill(lot);
  await page.getByRole("button", { name: "Filter" }).click();
  await page.getByRole("link", { name: lot, exact: true }).click();
  await expect(page.getByRole("heading", { name: `Lot ${lot}` })).toBeVisible();
  const cycles = page.getByRole("table", { name: "Cycles that washed the lot" });
  await expect(cycles).toContainText(`AW3-${tag}-1`);
  await expect(cycles).toContainText(`AW3-${tag}-2`);
});

test("the lot history page answers for a demo lot: its cycles, recipe version, bath and the test run of its parts", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  // The first valve-body run took one part from each of that morning's three cycles [db/seed-evidence.ts].
  await page.goto("/lots?q=VB210-2504");
  await page.getByRole("link", { name: "VB210-250408", exact: true }).click();
  await expect(page.getByRole("heading", { name: "Lot VB210-250408" })).toBeVisible();
  const cycles = page.getByRole("table", { name: "Cycles that washed the lot" });
  await expect(cycles.getByRole("row")).toHaveCount(4);
  await expect(cycles).toContainText("AW3-250408-T1");
  await expect(cycles).toContainText("R-AW3-VB v1");
  const runs = page.getByRole("table", { name: "Test runs on parts from these cycles" });
  await expect(runs).toContainText("Particle cleanliness");
  await expect(runs).toContainText("AW3-250408-T3 (1 part)");
  await expect(page.getByRole("link", { name: "Export PDF" })).toHaveAttribute(
    "href",
    "/api/lots/VB210-250408/export?format=pdf",
  );
});
