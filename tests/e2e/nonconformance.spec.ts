import { DEMO_PASSWORD, expect, signInAs, test, type DemoRole } from "./fixtures";
import type { Page } from "@playwright/test";

const PDF = Buffer.from(
  "%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n",
);

// The pump housing's recipe already has the demo's open change (CR-2026-002): the corrective
// action joins it, so this spec opens no change that another spec's recipe would trip over.
test.describe.configure({ mode: "serial", timeout: 180_000 });

let runUrl = "";
let runNumber = "";
let ncUrl = "";
let ncNumber = "";
const ACTION = "Add a chip-flush stage before the pump housing's cross bore";

async function sign(page: Page, button: string) {
  await page.getByRole("button", { name: button }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
}

async function openNc(page: Page, role: DemoRole) {
  await signInAs(page, role);
  await page.goto(ncUrl);
}

test("a particle run verified as Fail opens a nonconformance by itself", async ({ page }) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/runs/new");
  await page.getByLabel("Part family").selectOption({ label: "PF-PH-400 · Pump housing PH-400" });
  const inForce = await page
    .getByLabel("Recipe version")
    .locator("option", { hasText: /^R-AW3-PH v\d+ \(effective\)$/ })
    .textContent();
  await page.getByLabel("Recipe version").selectOption({ label: inForce! });
  await page.getByLabel("Test type").selectOption({ label: "Particle cleanliness" });
  await page.getByLabel("Analysing lab").fill("Larchfield cleanliness lab");
  await page.getByRole("button", { name: "Open test run" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Particle cleanliness");
  runUrl = page.url();
  runNumber = ((await page.getByRole("heading", { level: 1 }).textContent()) ?? "").split(" ")[0];

  await page.getByLabel("Sample (part serial)").fill("PH400-NC-1");
  await page.getByLabel("Components in the sample").fill("1");
  // Far beyond any class limit of the demo specifications: the run must fail.
  await page.getByLabel(/^All particles: class E /).fill("90000");
  await page.getByLabel("Largest metallic particle (µm)").fill("3000");
  await page.getByRole("button", { name: "Add sample" }).click();
  await expect(page.getByText("Sample PH400-NC-1 recorded.")).toBeVisible();
  await page.getByLabel("Extraction series (particles per extraction)").fill("100, 30, 8");
  await page.getByLabel("Blank value measured").check();
  await page.getByRole("button", { name: "Save extraction and blank" }).click();
  await expect(page.getByText("Extraction series and blank saved.")).toBeVisible();
  await expect(page.getByRole("heading", { name: /Computed outcome: Fail/ })).toBeVisible();
  await sign(page, "Sign as performed");
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Performed");

  await signInAs(page, "engineer");
  await page.goto(runUrl);
  await sign(page, "Sign as verified");
  // The run's page names the nonconformance its failure opened.
  const opened = page.getByRole("link", { name: /^NC-\d{4}-\d{3}$/ });
  await expect(opened).toBeVisible();
  ncNumber = (await opened.textContent())!;
  await expect(page.getByText("Nonconformance opened for this run:")).toBeVisible();

  // Found from the list, filtered in the address.
  await page.goto(`/nonconformances?q=${runNumber}`);
  await page.getByRole("link", { name: ncNumber }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`${ncNumber} · ${runNumber}`);
  ncUrl = page.url();
});

test("its containment lists the run; the affected item is held and scrapped, the rest released", async ({
  page,
}) => {
  test.skip(ncUrl === "", "needs the nonconformance raised above");
  await openNc(page, "engineer");
  const items = page.getByRole("table", { name: "Affected items" });
  await expect(items).toContainText(runNumber);
  await page
    .getByRole("form", { name: `Hold ${runNumber}` })
    .getByRole("button", { name: "Hold" })
    .click();
  const disposition = page.getByRole("form", { name: `Disposition of ${runNumber}` });
  await disposition.getByLabel("Disposition").selectOption({ label: "Scrap" });
  await disposition.getByRole("button", { name: "Record disposition" }).click();
  await expect(items).toContainText("Scrap");
  // Whatever else was tested since the last passing run is judged unaffected here.
  // The rest are released at once, each still audited.
  await page.getByRole("button", { name: /^Release all \d+ undecided items$/ }).click();
  await expect(items.getByRole("button", { name: "Release" })).toHaveCount(0);
  await expect(items).not.toContainText("Not yet decided");
  await page.getByRole("button", { name: "Confirm containment" }).click();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Contained");
});

test("a corrective action opens a linked change request", async ({ page }) => {
  test.skip(ncUrl === "", "needs the nonconformance raised above");
  await openNc(page, "engineer");
  const cause = page.getByRole("form", { name: "Root cause" });
  await cause.getByLabel("Five whys").check();
  await cause
    .getByRole("textbox", { name: "Root cause" })
    .fill("Chips from the new cross bore are not flushed before the wash stage.");
  await cause.getByRole("button", { name: "Save the root cause" }).click();
  await expect(page.getByText("Root cause saved.")).toBeVisible();
  await page.getByRole("button", { name: "Confirm the root cause" }).click();

  const add = page.getByRole("form", { name: "Add an action" });
  await add.getByLabel("What will be done").fill(ACTION);
  await add.getByLabel("Action owner").selectOption({ label: "Ines Varga" });
  // A due date before the detection is refused beside the field, and nothing typed is lost.
  await add.getByLabel("Action due on").fill("2020-01-01");
  await add.getByRole("button", { name: "Add the action" }).click();
  await expect(add.getByLabel("Action due on")).toHaveAccessibleDescription(
    /cannot be before the nonconformance was detected/,
  );
  await expect(add.getByLabel("What will be done")).toHaveValue(ACTION);
  await add.getByLabel("Action due on").fill("2099-01-31");
  await add.getByRole("button", { name: "Add the action" }).click();
  const actions = page.getByRole("table", { name: "Corrective and preventive actions" });
  await expect(actions).toContainText(ACTION);

  await page
    .getByRole("form", { name: `Change request for ${ACTION}` })
    .getByRole("button", { name: "Open a change request" })
    .click();
  await expect(page).toHaveURL(/\/changes\/[0-9a-f-]{36}$/);
  await expect(page.getByText("Corrective action of")).toBeVisible();
  await page.getByRole("link", { name: ncNumber }).click();
  await expect(actions).toContainText(/CR-\d{4}-\d{3}/);
});

test("the effectiveness check with evidence lets it close, signed by two people", async ({
  page,
}) => {
  test.skip(ncUrl === "", "needs the nonconformance raised above");
  await openNc(page, "engineer");
  await page.getByRole("button", { name: "Start the actions" }).click();
  const update = page.getByRole("form", { name: `Update ${ACTION}` });
  await update.getByLabel("Status").selectOption({ label: "Done" });
  await update.getByLabel("Evidence").fill("Chip-flush stage in the linked change request");
  await update.getByRole("button", { name: "Save" }).click();
  await expect(
    page.getByRole("table", { name: "Corrective and preventive actions" }),
  ).toContainText("Done");

  const plan = page.getByRole("form", { name: "Plan the effectiveness check" });
  await plan.getByLabel("Criterion").fill("The next particle run on the pump housing passes.");
  await plan.getByLabel("Check due on").fill("2099-03-31");
  await plan.getByRole("button", { name: "Save the plan" }).click();
  await expect(page.getByText("Effectiveness check planned.")).toBeVisible();
  await page.getByRole("button", { name: "Start the effectiveness check" }).click();

  // No evidence, no result.
  const record = page.getByRole("form", { name: "Record the effectiveness check" });
  await record.getByLabel("Effective", { exact: true }).check();
  await record.getByRole("button", { name: "Record the result" }).click();
  await expect(record.getByLabel("Evidence run number")).toHaveAccessibleDescription(
    /Give the evidence/,
  );

  await page
    .getByLabel("Upload a file")
    .setInputFiles({ name: "PH400 retest report.pdf", mimeType: "application/pdf", buffer: PDF });
  await expect(
    page.getByRole("status").filter({ hasText: "PH400 retest report.pdf stored" }),
  ).toBeVisible();
  await record.getByLabel("Or evidence file").selectOption({ label: "PH400 retest report.pdf" });
  await record.getByLabel("Effective", { exact: true }).check();
  await record.getByRole("button", { name: "Record the result" }).click();
  const effectiveness = page.getByRole("region", { name: "Effectiveness check" });
  await expect(effectiveness).toContainText("Effective ·");
  await expect(effectiveness).toContainText("PH400 retest report.pdf");
  await sign(page, "Sign the investigation for closure");
  await expect(page.getByRole("table", { name: "Signatures" })).toContainText("Ines Varga");

  await openNc(page, "approver");
  await sign(page, "Approve the closure");
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Closed");
  await expect(page.getByRole("table", { name: "Signatures" })).toContainText("Helena Okafor");
});
