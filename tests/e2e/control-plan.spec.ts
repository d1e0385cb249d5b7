import type { Browser, Page } from "@playwright/test";
import { DEMO_PASSWORD, expect, signInAs, test, type DemoRole } from "./fixtures";

async function as(browser: Browser, role: DemoRole, url: string) {
  const page = await browser.newPage();
  await signInAs(page, role);
  await page.goto(url);
  return page;
}

async function sign(page: Page, button: string) {
  await page.getByRole("button", { name: button }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
}

test("the engineer drafts a control plan, a reviewer and an approver sign it, and its due test reaches the technician's queue", async ({
  page,
  browser,
}) => {
  test.setTimeout(150_000);
  await signInAs(page, "engineer");
  await page.getByRole("navigation").getByRole("link", { name: "Control plans" }).click();
  await page.getByRole("link", { name: "New control plan" }).click();
  await expect(page).toHaveURL(/\/control-plans\/new$/);

  // The pump housing on its effective wash recipe is qualified and has no plan yet.
  const combination = page.getByLabel("Qualified combination");
  const option = combination
    .locator("option")
    .filter({ hasText: /^R-AW3-PH version \d+ × PF-PH-400 .*recipe version effective/ });
  const value = (await option.first().getAttribute("value"))!;
  await combination.selectOption(value);

  const line = page.getByRole("group", { name: "Line 1" });
  await line.getByLabel("Characteristic 1").selectOption({ label: "Dryness" });
  await line.getByLabel("Method 1").fill("Blow-off on black paper, no droplets in the cross bores");
  // Bad input first: no parts, every 0 cycles, no reaction plan — each refused beside its field.
  await line.getByLabel("Sample size 1").fill("0");
  await line.getByLabel("Frequency 1").selectOption({ label: "Every N cycles" });
  await line.getByLabel("Every N cycles 1").fill("0");
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(line.getByText("A sample size below 1 tests nothing")).toBeVisible();
  await expect(line.getByText("N must be at least 1 cycle.")).toBeVisible();
  await expect(line.getByText("a line without a reaction plan is refused")).toBeVisible();
  await expect(line.getByLabel("Method 1")).toHaveValue(
    "Blow-off on black paper, no droplets in the cross bores",
  );

  await line.getByLabel("Sample size 1").fill("3");
  await line.getByLabel("Frequency 1").selectOption({ label: "Per shift" });
  await line
    .getByLabel("Reaction plan 1")
    .fill("Wet parts: hold the basket, dry again, check the dryer's air temperature.");
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page).toHaveURL(/\/control-plans\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("heading", { name: "Version 1: Draft" })).toBeVisible();
  await sign(page, "Sign and send for review");
  await expect(page.getByRole("heading", { name: "Version 1: In review" })).toBeVisible();
  // The author cannot also review: the button is not offered to an engineer.
  await expect(page.getByRole("button", { name: "Sign as reviewed" })).toHaveCount(0);
  const url = page.url();

  const reviewer = await as(browser, "reviewer", "/queue");
  await reviewer
    .getByRole("table", { name: "Waiting for you" })
    .getByRole("row")
    .filter({ hasText: "Control plan review" })
    .filter({ hasText: "PF-PH-400" })
    .getByRole("link")
    .first()
    .click();
  await expect(reviewer).toHaveURL(url);
  await sign(reviewer, "Sign as reviewed");
  await expect(reviewer.getByRole("heading", { name: "Version 1: Reviewed" })).toBeVisible();
  await reviewer.close();

  const approver = await as(browser, "approver", url);
  await sign(approver, "Approve control plan");
  await expect(
    approver.getByRole("heading", { name: "Version 1: Approved, effective" }),
  ).toBeVisible();
  const due = approver.getByRole("table", { name: "Due state per line" });
  await expect(due.getByRole("row").filter({ hasText: "Dryness" })).toContainText("Due");
  await approver.close();

  const technician = await as(browser, "technician", "/queue");
  const item = technician
    .getByRole("table", { name: "Waiting for you" })
    .getByRole("row")
    .filter({ hasText: "Routine test" })
    .filter({ hasText: /Dryness · R-AW3-PH version \d+ × PF-PH-400/ });
  await expect(item).toContainText("per shift, 3 parts from 3 cycles");
  await item.getByRole("link").first().click();
  // The run form opens prefilled for the combination and the test.
  await expect(technician).toHaveURL(/\/evidence\/runs\/new\?recipeVersion=/);
  await expect(technician.getByLabel("Test type")).toHaveValue("dryness");
  await expect(technician.getByLabel("Part family")).not.toHaveValue("");
  await technician.screenshot({ path: "test-results/control-plan-run-prefill.png" });
  await technician.close();
});

test("the demo's valve-body plan shows its due state and an auditor reads it without signing", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  await page.goto("/control-plans");
  await page
    .getByRole("table", { name: "Control plans" })
    .getByRole("link", { name: /R-AW3-VB version \d+ × PF-VB-210/ })
    .click();
  const due = page.getByRole("table", { name: "Due state per line" });
  await expect(due.getByRole("row").filter({ hasText: "Bath concentration" })).toContainText(
    /Due|Overdue/,
  );
  await expect(page.getByText("Caution: hot and alkaline baths")).toBeVisible();
  await expect(page.getByRole("button", { name: /Sign|Approve/ })).toHaveCount(0);
  await page.screenshot({ path: "test-results/control-plan-page.png", fullPage: true });
});
