import { expect, signInAs, test } from "./fixtures";

const STATE_WORDS = /Action needed|Needs attention|In order/;

test("a quality engineer lands on the plant overview, reads each washer's state in words and follows its tiles to the records", async ({
  page,
}, testInfo) => {
  // Two viewports, two screenshots and three round trips: more than the default minute on a busy machine.
  test.setTimeout(150_000);
  await signInAs(page, "engineer");
  await expect(page).toHaveURL(/\/overview$/);
  await expect(page.getByRole("heading", { name: "Plant overview", level: 1 })).toBeVisible();

  // Both demo washers, each with its state as a word and the reasons beside it.
  const aw3 = page.getByRole("article", { name: /AW-3/ });
  const sc1 = page.getByRole("article", { name: /SC-1/ });
  await expect(aw3.getByRole("heading", { level: 3 })).toContainText("Three-tank aqueous washer");
  await expect(aw3).toContainText(STATE_WORDS);
  await expect(sc1).toContainText(STATE_WORDS);
  // The wash tank's latest reading is judged in words: the demo's is beyond its action limit, but
  // the bath-log test (run alongside) records one within limits. Its filter change is overdue.
  const baths = aw3.getByRole("table", { name: "Baths, AW-3" });
  const tank1 = baths.getByRole("row", { name: /Tank 1/ });
  await expect(tank1).toContainText(/Within action limits|Beyond (action|reject) limit/);
  await expect(aw3.getByRole("list", { name: "Why: AW-3" })).toContainText(
    "filter change: overdue",
  );
  // A safety caution sits beside baths beyond their limits.
  if (/Beyond/.test((await tank1.textContent()) ?? ""))
    await expect(page.getByRole("note")).toContainText("Caution: correcting a bath");

  // Last results by part family, with a trend whose limit is drawn and named.
  const family = aw3.getByRole("region", { name: /PF-VB-210/ });
  await expect(family.getByRole("table", { name: /Last verified results/ })).toContainText(
    "Particle cleanliness",
  );
  await expect(family.getByRole("figure", { name: /Trend/ })).toContainText("limit 100 %");

  // The overdue section lists the overdue filter change first, with its state as a word.
  const overdue = page.getByRole("table", { name: "Overdue and due tests and checks" });
  await expect(overdue.getByRole("row").nth(1)).toContainText("Overdue");
  await expect(overdue).toContainText("Filter change");

  await page.screenshot({ path: testInfo.outputPath("overview-1280.png"), fullPage: true });

  // A tablet: nothing spills sideways out of the page.
  await page.setViewportSize({ width: 820, height: 1100 });
  await page.reload();
  await expect(aw3).toBeVisible();
  const spill = await page.evaluate(
    () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
  );
  expect(spill).toBeLessThanOrEqual(0);
  await page.screenshot({ path: testInfo.outputPath("overview-820.png"), fullPage: true });
  await page.setViewportSize({ width: 1280, height: 900 });

  // Tiles lead to their records.
  await baths.getByRole("link", { name: /Tank 1/ }).click();
  await expect(page).toHaveURL(/\/evidence\/bath\/[0-9a-f-]{36}$/);
  await expect(page).toHaveTitle(/^Tank log \S+ · .*Tank 1.* · Washproof$/);
  await page.goBack();
  await page
    .getByRole("region", { name: "Plant summary" })
    .getByRole("link", { name: /Open nonconformances/ })
    .click();
  await expect(page).toHaveURL(/\/nonconformances$/);
  await page.goBack();
  await family
    .getByRole("table", { name: /Last verified results/ })
    .getByRole("link", { name: /^TR-/ })
    .first()
    .click();
  await expect(page).toHaveURL(/\/evidence\/runs\/[0-9a-f-]{36}$/);
});

test("an auditor reads the plant overview with no control that writes", async ({ page }) => {
  await signInAs(page, "auditor");
  await page
    .getByRole("navigation", { name: "Main" })
    .getByRole("link", { name: "Plant overview" })
    .click();
  await expect(page.getByRole("heading", { name: "Plant overview", level: 1 })).toBeVisible();
  await expect(page.getByRole("article", { name: /AW-3/ })).toContainText(STATE_WORDS);
  const main = page.getByRole("main");
  await expect(main.locator("form")).toHaveCount(0);
  await expect(main.getByRole("button")).toHaveCount(0);
});

test("a technician still lands on My queue", async ({ page }) => {
  await signInAs(page, "technician");
  await expect(page).toHaveURL(/\/queue$/);
});
