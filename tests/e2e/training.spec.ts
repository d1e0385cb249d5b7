import { DEMO_PASSWORD, expect, signInAs, test } from "./fixtures";

test.describe.configure({ mode: "serial", timeout: 180_000 });

const GR = "GR-01 v1 · Residue weighing on 5 µm membranes";
const EX = "EX-01 v1 · Pressure rinsing of valve bodies and pump housings";

test("a technician whose weighing training lapsed cannot sign performed; after the trainer's sign-off they can", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/queue");
  await expect(page.getByText("Lapsed: your training on GR-01")).toBeVisible();
  await page.getByRole("navigation").getByRole("link", { name: "Training" }).click();
  const matrix = page.getByRole("table", { name: "Training matrix" });
  await expect(matrix.getByRole("row", { name: /Ravi Menon/ })).toContainText(/Lapsed on \d{4}/);

  await page.goto("/evidence");
  await page.getByRole("link", { name: "New test run" }).click();
  await page.getByLabel("Part family").selectOption({ label: "PF-VB-210 · Valve body VB-210" });
  const inForce = await page
    .getByLabel("Recipe version")
    .locator("option", { hasText: /^R-AW3-VB v\d+ \(effective\)$/ })
    .textContent();
  await page.getByLabel("Recipe version").selectOption({ label: inForce! });
  await page.getByLabel("Test type").selectOption({ label: "Gravimetric" });
  await page.getByLabel("Analysing lab").fill("Larchfield cleanliness lab");
  await page.getByRole("button", { name: "Open test run" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Gravimetric");
  const runUrl = page.url();

  const methods = page.getByRole("form", { name: "Methods used" });
  await methods.getByLabel("Extraction procedure").selectOption({ label: EX });
  await methods.getByLabel("Gravimetric method").selectOption({ label: GR });
  await methods.getByRole("button", { name: "Save methods used" }).click();
  await expect(page.getByRole("list", { name: "Cited methods" })).toContainText("GR-01 v1");

  await page.getByLabel("Sample (part serial)").fill("VB210-TRN-1");
  await page.getByLabel("Components filtered").fill("5");
  await page.getByLabel("Filter mass before (mg)").fill("101.20");
  await page.getByLabel("Filter mass after (mg)").fill("103.45");
  await page.getByRole("button", { name: "Add sample" }).click();
  await expect(page.getByText("Sample VB210-TRN-1 recorded.")).toBeVisible();

  await page.getByRole("button", { name: "Sign as performed" }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(
    dialog.getByText(
      /Your training on GR-01 v1 Residue weighing on 5 µm membranes lapsed on \d{4}-\d{2}-\d{2}/,
    ),
  ).toBeVisible();
  await page.keyboard.press("Escape");
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Open");

  // The approver, a trainer by role, signs off the retraining.
  await signInAs(page, "approver");
  await page.goto("/lab/training");
  const signOff = page.getByRole("form", { name: "Sign off practical training" });
  await signOff.getByLabel("Person trained").selectOption({ label: "Ravi Menon" });
  await signOff.getByLabel("Lab method").selectOption({ label: GR });
  await signOff.getByLabel("Your password").fill(DEMO_PASSWORD);
  await signOff.getByRole("button", { name: "Sign off training" }).click();
  await expect(page.getByText(/Ravi Menon is trained on GR-01 v1 until \d{4}/)).toBeVisible();
  await expect(
    page.getByRole("table", { name: "Training matrix" }).getByRole("row", { name: /Ravi Menon/ }),
  ).not.toContainText("Lapsed");
  await page.screenshot({ path: "test-results/training-matrix.png", fullPage: true });

  await signInAs(page, "technician");
  await page.goto(runUrl);
  await page.getByRole("button", { name: "Sign as performed" }).click();
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Performed");
});

test("an engineer drafts an analysis method, bad values are refused beside their fields, and an approver approves it", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  await page.goto("/lab/methods");
  await page.getByRole("link", { name: "New lab method" }).click();
  await page.getByLabel("Kind of method").selectOption({ label: "Analysis method" });
  await page.getByLabel("Code").fill("AN-02");
  await page.getByLabel("Name").fill("Membrane analysis, manual microscope");
  await page.getByLabel("Filter membrane material").fill("Cellulose nitrate");
  await page.getByLabel("Pore size").fill("5");
  await page.getByLabel("Analysis system").selectOption({ label: "Light microscope, manual" });
  await page.getByLabel("Magnification").fill("0");
  await page.getByLabel("Lower size limit").fill("15");
  await page.getByLabel("Metallic (by element analysis)").check();
  await page.getByLabel("Fibre").check();
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByText("Magnification must be more than 0×")).toBeVisible();
  await expect(page.getByText("Only SEM/EDX tells metallic particles apart")).toBeVisible();
  await expect(page.getByLabel("Code")).toHaveValue("AN-02");
  await expect(page.getByLabel("Filter membrane material")).toHaveValue("Cellulose nitrate");
  await page.screenshot({ path: "test-results/method-form-errors.png", fullPage: true });

  await page.getByLabel("Magnification").fill("25");
  await page.getByLabel("Metallic (by element analysis)").uncheck();
  await page.getByLabel("Reflective", { exact: true }).check();
  await page.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("AN-02 v1");
  await expect(page.getByText("Status: Draft")).toBeVisible();
  await expect(page.getByRole("button", { name: "Approve method" })).toHaveCount(0);

  await signInAs(page, "approver");
  await page.goto("/lab/methods");
  await page.getByRole("link", { name: "AN-02 v1" }).click();
  await page.getByRole("button", { name: "Approve method" }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByText("Status: Approved")).toBeVisible();
  await expect(page.getByRole("table", { name: "Signatures" })).toContainText("Helena Okafor");
});

test("a technician acknowledges the bath-change procedure in force; a wrong password keeps the choice", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/lab/training");
  const matrix = page.getByRole("table", { name: "Training matrix" });
  await expect(matrix).not.toContainText("SOP-AW3-0001");
  const form = page.getByRole("form", { name: "Acknowledge a procedure" });
  const sop = "SOP-AW3-0001 v1 · Changing the wash bath and its filter on the three-tank washer";
  await form.getByLabel("Procedure").selectOption({ label: sop });
  await form.getByLabel("Your password").fill("not my password");
  await form.getByRole("button", { name: "Sign acknowledgement" }).click();
  // The reason is said once, beside the password; the banner points to it.
  await expect(form.getByRole("alert")).toHaveText("One field needs attention: Password.");
  await expect(form.getByLabel("Your password")).toHaveAccessibleDescription(
    /The password is not correct\. Nothing was signed\./,
  );
  await expect(form.getByText("The password is not correct.", { exact: false })).toHaveCount(1);
  await expect(form.getByLabel("Your password")).toHaveValue("");
  await expect(form.getByLabel("Procedure")).toHaveValue(
    (await form.getByRole("option", { name: sop }).getAttribute("value"))!,
  );
  await form.getByLabel("Your password").fill(DEMO_PASSWORD);
  await form.getByRole("button", { name: "Sign acknowledgement" }).click();
  // Acknowledged and current: the procedure is no longer offered, and it is a column of the matrix.
  await expect(page.getByRole("option", { name: sop })).toHaveCount(0);
  await page.reload();
  await expect(matrix.getByRole("columnheader", { name: /SOP-AW3-0001 v1/ })).toBeVisible();
  const column = await matrix.getByRole("columnheader").allTextContents();
  const index = column.findIndex((c) => c.includes("SOP-AW3-0001"));
  await expect(
    matrix
      .getByRole("row", { name: /Ravi Menon/ })
      .getByRole("cell")
      .nth(index - 1),
  ).toContainText("Current until");
});
