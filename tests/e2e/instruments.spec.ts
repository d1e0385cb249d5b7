import { DEMO_PASSWORD, expect, signInAs, test } from "./fixtures";

test.describe.configure({ mode: "serial", timeout: 180_000 });

const ASSET = "E2E-TH-1";
let instrumentUrl = "";
let runUrl = "";

test("an engineer registers a thermometer and records a calibration long past; bad input is refused beside its field", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  await page
    .getByRole("navigation", { name: "Main" })
    .getByRole("link", { name: "Instruments" })
    .click();
  await expect(page.getByRole("table", { name: "Instrument register" })).toContainText("CM-01");
  await page.getByRole("link", { name: "Register an instrument" }).click();
  const form = page.getByRole("form", { name: "Register an instrument" });
  await form.getByLabel("Asset number").fill(ASSET);
  await form.getByLabel("Kind").selectOption({ label: "Thermometer" });
  await form.getByLabel("Description").fill("Wash tank probe, E2E");
  await form.getByLabel("Location").fill("Washer AW3, wash tank");
  await form.getByLabel("Range (optional)").fill("0–100 °C");
  await form.getByLabel("Calibration interval").fill("-6");
  await form.getByRole("button", { name: "Register the instrument" }).click();
  await expect(form.getByText("The interval is at least 1 month.")).toBeVisible();
  // Nothing typed is lost.
  await expect(form.getByLabel("Description")).toHaveValue("Wash tank probe, E2E");
  await form.getByLabel("Calibration interval").fill("12");
  await form.getByRole("button", { name: "Register the instrument" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`${ASSET} · Thermometer`);
  instrumentUrl = page.url();
  await expect(page.getByText("No calibration on record").first()).toBeVisible();

  const cal = page.getByRole("form", { name: "Record a calibration" });
  await expect(page.getByText("Caution: checking an instrument in place")).toBeVisible();
  await cal.getByLabel("Calibrated on").fill("2024-01-10");
  await cal.getByLabel("Next due (optional)").fill("2023-12-01");
  await cal.getByLabel("External calibration lab").check();
  await cal.getByLabel("Person or calibration lab").fill("Harrowgate Metrology");
  await cal.getByLabel("Result as found").selectOption({ label: "Pass" });
  await cal.getByRole("button", { name: "Record the calibration" }).click();
  await expect(cal.getByText("The due date must be after the calibration date.")).toBeVisible();
  await cal.getByLabel("Next due (optional)").fill("2025-01-10");
  await cal.getByRole("button", { name: "Record the calibration" }).click();
  await expect(page.getByText("Calibration recorded; next due 2025-01-10.")).toBeVisible();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText(
    "Overdue since 2025-01-11",
  );
});

test("a technician's run citing the overdue thermometer cannot be signed performed, and says which and since when", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/runs/new");
  await page.getByLabel("Part family").selectOption({ label: "PF-VB-210 · Valve body VB-210" });
  const inForce = await page
    .getByLabel("Recipe version")
    .locator("option", { hasText: /^R-AW3-VB v\d+ \(effective\)$/ })
    .textContent();
  await page.getByLabel("Recipe version").selectOption({ label: inForce! });
  await page.getByLabel("Test type").selectOption({ label: "Particle cleanliness" });
  await page.getByLabel("Analysing lab").fill("Larchfield cleanliness lab");
  await page.getByRole("button", { name: "Open test run" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Particle cleanliness");
  runUrl = page.url();
  await page.getByLabel("Sample (part serial)").fill("VB210-INS-1");
  await page.getByLabel("Components in the sample").fill("3");
  await page.getByLabel("All particles: class E (50–100 µm), particles").fill("14");
  await page.getByRole("button", { name: "Add sample" }).click();
  await expect(page.getByText("Sample VB210-INS-1 recorded.")).toBeVisible();

  const cite = page.getByRole("form", { name: "Instruments used" });
  await cite.getByLabel(new RegExp(`^${ASSET} · Thermometer`)).check();
  await cite.getByRole("button", { name: "Save the instruments used" }).click();
  await expect(page.getByText(`Cited: ${ASSET}.`)).toBeVisible();
  await expect(page.getByRole("region", { name: "Instruments used" })).toContainText(
    "overdue since 2025-01-11",
  );

  await page.getByRole("button", { name: "Sign as performed" }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(dialog).toContainText(
    `Thermometer ${ASSET} (Wash tank probe, E2E) is past its calibration due date (2025-01-10): overdue since 2025-01-11.`,
  );
  await page.screenshot({ path: "test-results/instruments-refused.png", fullPage: true });
  await page.keyboard.press("Escape");
  await page.reload();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Open");

  // The technician's queue lists the overdue thermometer and the demo's meter falling due.
  await page.goto("/queue");
  await expect(page.getByText(`${ASSET} · Thermometer`)).toBeVisible();
  await expect(page.getByText("CM-01 · Conductivity meter")).toBeVisible();
});

test("after the calibration is recorded the run can be signed performed", async ({ page }) => {
  await signInAs(page, "technician");
  await page.goto(instrumentUrl);
  const cal = page.getByRole("form", { name: "Record a calibration" });
  await cal.getByLabel("Our lab").check();
  await cal.getByLabel("Person or calibration lab").fill("Ravi Menon");
  await cal.getByLabel("Result as found").selectOption({ label: "Pass" });
  await cal.getByRole("button", { name: "Record the calibration" }).click();
  await expect(page.getByText(/Calibration recorded; next due \d{4}-\d{2}-\d{2}\./)).toBeVisible();
  await expect(
    page.getByRole("table", { name: "Calibration history" }).locator("tbody tr"),
  ).toHaveCount(2);
  await page.screenshot({ path: "test-results/instruments-page.png", fullPage: true });

  await page.goto(runUrl);
  await page.getByRole("button", { name: "Sign as performed" }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Performed");
});

test("an auditor reads the register but has no forms", async ({ page }) => {
  await signInAs(page, "auditor");
  await page.goto(instrumentUrl);
  await expect(page.getByRole("table", { name: "Calibration history" })).toBeVisible();
  await expect(page.getByRole("form", { name: "Record a calibration" })).toHaveCount(0);
  await expect(page.getByRole("form", { name: "Retire the instrument" })).toHaveCount(0);
  await page.goto("/instruments/new");
  await expect(page.getByRole("form", { name: "Register an instrument" })).toHaveCount(0);
});
