import type { Browser, Page } from "@playwright/test";
import { DEMO_PASSWORD, expect, signInAs, test, type DemoRole } from "./fixtures";
import { recordPassingEvidence } from "./support/evidence";

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

/** The engineer opens a change request on the spray-fitting recipe, and withdraws it at the end so the recipe is free again. */
async function openOnSprayFitting(page: Page, title: string) {
  await signInAs(page, "engineer");
  await page.goto("/systems");
  await page.getByRole("link", { name: "R-SC1-SF Fitting, spray" }).click();
  await page.getByLabel("What should change").fill(title);
  await page.getByRole("button", { name: /Open change request against version 2/ }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(title);
}

async function withdraw(page: Page, reason: string) {
  await page.getByRole("button", { name: "Withdraw" }).click();
  await page.getByRole("dialog").getByLabel("Reason").fill(reason);
  await page.getByRole("dialog").getByRole("button", { name: "Withdraw" }).click();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Withdrawn");
}

test("impossible setpoints, a low above its high and a foreign unit get clear errors, and nothing typed is lost", async ({ page }) => {
  await openOnSprayFitting(page, "Try impossible values");

  await page.getByLabel("Setpoint of Wash temperature").fill("104");
  await page.getByLabel("Setpoint of Wash time").fill("-30");
  await page.getByLabel("Validated low of Spray pressure").fill("6");
  await page.getByLabel("Unit of Detergent concentration").fill("bar");
  await page.getByRole("button", { name: "Save proposal" }).click();

  await expect(page.getByRole("form", { name: "Proposed change" }).getByRole("alert")).toContainText("Nothing was saved");
  await expect(page.getByText("An open aqueous bath boils at about 100 °C: a setpoint of 104 °C is not possible.")).toBeVisible();
  await expect(page.getByText("A time cannot be negative: setpoint -30 s.")).toBeVisible();
  await expect(page.getByText("The validated low (6 bar) is above the validated high (5 bar).")).toBeVisible();
  await expect(page.getByText('Detergent concentration is given in % or g/L, not "bar".')).toBeVisible();
  await expect(page.getByLabel("Setpoint of Wash temperature")).toHaveValue("104");
  await expect(page.getByLabel("Setpoint of Wash time")).toHaveValue("-30");

  await withdraw(page, "Only checking the input rules");
});

test("two tabs on one proposal: each tab's own saves go through, a save from an older reading is refused and keeps what was typed", async ({ page }) => {
  await openOnSprayFitting(page, "Two tabs on one proposal");
  const older = await page.context().newPage();
  await older.goto(page.url());

  const impact = page.getByRole("region", { name: "Computed impact" });
  await page.getByLabel("Setpoint of Wash temperature").fill("58");
  await page.getByRole("button", { name: "Save proposal" }).click();
  await expect(impact).toContainText("→ 58 °C");
  await page.getByLabel("Setpoint of Wash temperature").fill("59");
  await page.getByRole("button", { name: "Save proposal" }).click();
  await expect(impact).toContainText("→ 59 °C");

  await older.getByLabel("Setpoint of Wash temperature").fill("61");
  await older.getByRole("button", { name: "Save proposal" }).click();
  await expect(older.getByRole("form", { name: "Proposed change" }).getByRole("alert")).toContainText("Someone saved this proposal after you opened it. Nothing was saved");
  await expect(older.getByLabel("Setpoint of Wash temperature")).toHaveValue("61");
  await older.close();
  await page.reload();
  await expect(page.getByLabel("Setpoint of Wash temperature")).toHaveValue("59");

  await withdraw(page, "Only checking two tabs");
});

test("a wash temperature above its validated range is major, is requalified with verified evidence, and becomes effective on closure", async ({ page, browser }) => {
  test.setTimeout(180_000);
  await signInAs(page, "engineer");
  await page.goto("/systems");
  await page.getByRole("link", { name: "R-AW3-VB Valve body, ultrasonic" }).click();
  await expect(page.getByRole("heading", { name: "Effective version 2" })).toBeVisible();
  await page.getByLabel("What should change").fill("Wash valve bodies at 70 °C");
  await page.getByRole("button", { name: "Open change request against version 2" }).click();

  await expect(page.getByRole("note").filter({ hasText: "hot bath" })).toBeVisible();
  await page.getByLabel("Setpoint of Bath temperature").fill("70");
  // The justification is a change-narrative document in the documents editor, saved as it is typed.
  const narrative = page.getByRole("textbox", { name: "Document text" });
  await narrative.click();
  await page.keyboard.type("Heavier chip load from the new line. Risk: hotter bath, burns at the tank; requalify cleanliness.");
  await expect(page.getByRole("region", { name: "Justification and risk assessment" }).getByRole("status")).toContainText("All changes saved");
  await page.getByRole("button", { name: "Save proposal" }).click();
  await expect(page.getByText("Saved. The parameter diff")).toBeVisible();

  const impact = page.getByRole("region", { name: "Computed impact" });
  await expect(impact).toContainText("Impact: Major");
  await expect(impact).toContainText("Setpoint 60 → 70 °C, outside the validated range 50–65 °C.");
  const required = impact.getByRole("table", { name: "Required tests" });
  await expect(required.getByRole("row", { name: /Particle cleanliness 29 parts 95 % \/ 90 %/ })).toBeVisible();
  await expect(required.getByRole("row", { name: /Gravimetric residue 29 parts/ })).toBeVisible();
  const diff = page.getByRole("table", { name: "Parameter diff" });
  await expect(diff.getByRole("row", { name: /Bath temperature/ })).toContainText("Outside range");

  await sign(page, "Sign and submit impact assessment");
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Impact assessed");
  await expect(page.getByRole("region", { name: "Proposed version 3" })).toContainText("Heavier chip load from the new line.");
  const changeUrl = page.url();

  const approver = await as(browser, "approver", changeUrl);
  await sign(approver, "Approve for implementation");
  await expect(approver.getByRole("table", { name: "Signatures" })).toContainText("Helena Okafor");
  await approver.close();

  // The author is told by e-mail that the change may go ahead (read in the demo mailbox).
  const number = (await page.getByRole("heading", { level: 1 }).textContent())!.split(" ")[0];
  const mailbox = await as(browser, "admin", "/admin/email");
  await expect(async () => {
    await mailbox.reload();
    await expect(mailbox.getByRole("region", { name: "Demo mailbox" }).getByText(`[Washproof] ${number} approved for implementation`)).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 30_000 });
  await mailbox.close();

  await page.reload();
  await page.getByRole("button", { name: "Start requalification" }).click();
  await expect(page.getByRole("heading", { name: "Requalification gate: not met" })).toBeVisible();

  const toVersion = Number((await page.getByRole("heading", { level: 1 }).locator("..").textContent())?.match(/proposed version (\d+)/)?.[1]);
  await recordPassingEvidence(browser, { recipe: "R-AW3-VB", version: toVersion, tests: [{ type: "Particle cleanliness", samples: 29 }, { type: "Gravimetric residue", samples: 29 }] });

  const reviewer = await as(browser, "reviewer", changeUrl);
  await expect(reviewer.getByRole("heading", { name: "Requalification gate: met" })).toBeVisible();
  await sign(reviewer, "Verify change");
  await expect(reviewer.getByRole("heading", { level: 1 }).locator("..")).toContainText("Verified");
  await reviewer.close();

  const closer = await as(browser, "approver", changeUrl);
  await closer.getByRole("button", { name: "Close and make effective" }).click();
  await expect(closer.getByText(`version ${toVersion} is effective.`)).toBeVisible();
  await expect(closer.getByRole("heading", { level: 1 }).locator("..")).toContainText("Closed");
  await closer.getByRole("link", { name: "R-AW3-VB" }).first().click();
  await expect(closer.getByRole("heading", { name: `Effective version ${toVersion}` })).toBeVisible();
  await expect(closer.getByRole("table", { name: `Parameters of version ${toVersion}` })).toContainText("70 °C");
  await closer.close();
});

test("closing without evidence is refused with the list of what is missing", async ({ page }) => {
  await signInAs(page, "approver");
  await page.goto("/changes");
  await page.getByRole("link", { name: "CR-2026-002" }).click();
  await expect(page.getByRole("list", { name: "What is missing" })).toContainText("Particle cleanliness (29 samples): no test run linked");
  await page.getByRole("button", { name: "Close and make effective" }).click();
  await expect(page.getByRole("form", { name: "Close and make effective" }).getByRole("alert")).toHaveText(
    "The requalification gate is not met. Missing: Gravimetric residue (29 samples): no test run linked; Particle cleanliness (29 samples): no test run linked.",
  );
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Requalification");
});
