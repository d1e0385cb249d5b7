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

/** A calendar day (UTC) counted from today, as the server counts it. */
function dayFromToday(days: number) {
  const d = new Date(Date.now() + days * 86_400_000);
  const two = (n: number) => String(n).padStart(2, "0");
  return `${d.getUTCFullYear()}-${two(d.getUTCMonth() + 1)}-${two(d.getUTCDate())}`;
}

async function expectMail(browser: Browser, subject: RegExp) {
  const mailbox = await as(browser, "admin", "/admin/email");
  await expect(async () => {
    await mailbox.reload();
    await expect(
      mailbox.getByRole("region", { name: "Demo mailbox" }).getByText(subject).first(),
    ).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 60_000 });
  await mailbox.close();
}

test("an engineer drafts a deviation, an approver approves it, and it shows in the parameter's trace", async ({
  page,
  browser,
}) => {
  test.setTimeout(120_000);
  await signInAs(page, "engineer");
  await page.getByRole("navigation").getByRole("link", { name: "Deviations" }).click();
  await page.getByRole("link", { name: "New deviation" }).click();
  await expect(page).toHaveURL(/\/deviations\/new$/);

  const title = `Injection at 16 bar while the nozzles are re-drilled ${Date.now()}`;
  await page
    .getByLabel("Recipe")
    .selectOption({ label: "R-AW3-PH · Pump housing, flood and injection" });
  await page.getByLabel("Title").fill(title);
  await page
    .getByLabel("Justification")
    .fill(
      "The re-drilled fixture nozzles arrive next week; until then 16 bar clears the cross bore.",
    );
  await page.getByLabel("Risk level").selectOption({ label: "Medium" });
  await page
    .getByLabel("Risk and how it is contained")
    .fill("Seal wear on the fixture, checked at every shift change.");
  await page.getByLabel("PF-PH-400 · Pump housing PH-400").check();
  await page
    .getByLabel("Parameter 1", { exact: true })
    .selectOption({ label: "Injection pressure (wash.injection_pressure)" });
  // Bad input first: an inverted range and a last day in the past, refused beside their fields.
  await page.getByLabel("Temporary low 1").fill("16");
  await page.getByLabel("Temporary high 1").fill("12");
  await page.getByLabel("Last day").fill(dayFromToday(-2));
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByText("The high limit must not be below the low limit.")).toBeVisible();
  await expect(page.getByText("The end date is in the past")).toBeVisible();
  await expect(page.getByLabel("Title")).toHaveValue(title);

  await page.getByLabel("Temporary low 1").fill("10");
  await page.getByLabel("Temporary high 1").fill("16");
  // Its last day is tomorrow: inside the three days' reminder window.
  await page.getByLabel("Last day").fill(dayFromToday(1));
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page).toHaveURL(/\/deviations\/[0-9a-f-]{36}$/);
  const heading = (await page.getByRole("heading", { level: 1 }).textContent())!;
  const number = heading.split(" ")[0];
  expect(number).toMatch(/^DV-\d{4}-\d{3}$/);
  await expect(page.getByRole("table", { name: "Temporary values" })).toContainText("10–16 bar");

  await sign(page, "Sign and submit for approval");
  await expect(page.getByText("signed by its author, waiting for approval")).toBeVisible();
  const url = page.url();

  const approver = await as(browser, "approver", url);
  await sign(approver, "Approve deviation");
  await expect(approver.getByText("State: Active")).toBeVisible();
  await expect(approver.getByRole("table", { name: "Signatures" })).toContainText("Helena Okafor");
  await approver.close();

  // Approved within its reminder window, it is reminded at once.
  await expectMail(browser, new RegExp(`Deviation ${number} ends in 1 day`));

  await page.reload();
  await page.getByRole("link", { name: "Trace of wash.injection_pressure" }).click();
  const listed = page.getByRole("list", { name: "Temporary deviations of this parameter" });
  await expect(listed).toContainText(number);
  await expect(listed).toContainText("Active");
  await expect(listed).toContainText("temporary 10–16 bar instead of the validated 10–15 bar");
});

test("a deviation past its last day has expired, and its reminder e-mail reached the mailbox", async ({
  page,
  browser,
}) => {
  // The demo's dryer deviation ended 20 days ago; it was reminded three days before [db/seed-deviations.ts].
  await signInAs(page, "auditor");
  await page.goto("/deviations?state=expired");
  const table = page.getByRole("table", { name: "Deviations" });
  const row = table.getByRole("row", { name: /Dry fittings at 90 °C/ });
  await expect(row).toContainText("Expired");
  await row.getByRole("link").click();
  await expect(page.getByText("State: Expired — its last day has passed")).toBeVisible();
  await expect(page.getByRole("table", { name: "Lots under this deviation" })).toContainText(
    "SF12-L2610-03",
  );
  await expectMail(browser, /Deviation DV-\d{4}-\d{3} ends in 3 days: Dry fittings at 90 °C/);
});
