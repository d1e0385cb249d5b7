import { DEMO_PASSWORD, expect, signInAs, test } from "./fixtures";

const PDF = Buffer.from(
  "%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n",
);
const PNG = Buffer.from(
  "89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a5f6fd3c0000000049454e44ae426082",
  "hex",
);

test.describe.configure({ mode: "serial", timeout: 180_000 });

let runUrl = "";
let runNumber = "";

test("a technician records a particle test with its extraction series, uploads a PDF and an image, and signs it performed", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/evidence");
  await page.getByRole("link", { name: "New test run" }).click();
  await page.getByLabel("Part family").selectOption({ label: "PF-VB-210 · Valve body VB-210" });
  // The change-control spec may have made a later valve-body version effective meanwhile: take whichever is in force.
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
  runNumber = ((await page.getByRole("heading", { level: 1 }).textContent()) ?? "").split(" ")[0];

  // A bad count keeps everything typed and says what is wrong.
  await page.getByLabel("Sample (part serial)").fill("VB210-E2E-1");
  await page.getByLabel("Components in the sample").fill("3");
  await page.getByLabel("All particles: class E (50–100 µm), particles").fill("fourteen");
  await page.getByRole("button", { name: "Add sample" }).click();
  await expect(page.getByText("Class E count must be a number.")).toBeVisible();
  await expect(page.getByLabel("Sample (part serial)")).toHaveValue("VB210-E2E-1");

  await page.getByLabel("All particles: class E (50–100 µm), particles").fill("14");
  await page.getByLabel("All particles: class F (100–150 µm), particles").fill("6");
  await page.getByLabel("All particles: class H (200–400 µm), particles").fill("1");
  await page.getByLabel("Largest metallic particle (µm)").fill("350");
  await page.getByRole("button", { name: "Add sample" }).click();
  await expect(page.getByText("Sample VB210-E2E-1 recorded.")).toBeVisible();
  await expect(page.getByRole("heading", { name: /Raw data \(1 sample\)/ })).toBeVisible();
  await expect(page.getByText("No blank value recorded")).toBeVisible();

  await page.getByLabel("Extraction series (particles per extraction)").fill("100, 30, 8");
  await page.getByLabel("Blank value measured").check();
  await page.getByLabel("Blank: class B (5–15 µm), particles").fill("3");
  await page.getByRole("button", { name: "Save extraction and blank" }).click();
  await expect(page.getByText("Extraction series and blank saved.")).toBeVisible();
  await expect(
    page.getByText("Decay value ≤ 10 % at extraction 3: extraction qualified"),
  ).toBeVisible();

  const upload = page.getByRole("form", { name: "Upload evidence file" });
  await upload
    .getByLabel("Evidence file")
    .setInputFiles({ name: "VB210 lab report.pdf", mimeType: "application/pdf", buffer: PDF });
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("status")).toContainText("VB210 lab report.pdf uploaded");
  await upload
    .getByLabel("Evidence file")
    .setInputFiles({ name: "membrane-1.png", mimeType: "image/png", buffer: PNG });
  await upload.getByLabel("Kind").selectOption({ label: "Membrane image" });
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("status")).toContainText("membrane-1.png uploaded");
  await expect(page.getByRole("link", { name: "membrane-1.png" })).toBeVisible();

  await expect(page.getByRole("heading", { name: /Computed outcome: Pass/ })).toBeVisible();
  // 14, 6, 1 particles over 3 × 420 cm² → E 11.1, F 4.76, H 0.79 per 1000 cm² → E4, F3, H0 [derived]
  await expect(page.getByTestId("run-ccc")).toContainText("E4/F3/G00/H0");

  await page.getByRole("button", { name: "Sign as performed" }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText("Performed");
  await expect(page.getByRole("table", { name: "Signatures" })).toContainText("Ravi Menon");
});

test("bad files get a clear error and nothing is stored", async ({ page }) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/runs/new");
  await page.getByLabel("Part family").selectOption({ label: "PF-SF-12 · Straight fitting SF-12" });
  // A run opens only on a qualified combination: the fitting's effective recipe.
  const fittingRecipe = await page
    .getByLabel("Recipe version")
    .locator("option", { hasText: /^R-SC1-SF v\d+ \(effective\)$/ })
    .textContent();
  await page.getByLabel("Recipe version").selectOption({ label: fittingRecipe! });
  await page.getByLabel("Test type").selectOption({ label: "Visual" });
  await page.getByLabel("Analysing lab").fill("Line 3 inspection");
  await page.getByRole("button", { name: "Open test run" }).click();
  const upload = page.getByRole("form", { name: "Upload evidence file" });
  await upload
    .getByLabel("Evidence file")
    .setInputFiles({ name: "report.pdf", mimeType: "application/pdf", buffer: PNG });
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("alert")).toContainText(
    "named as a PDF, but its contents are a PNG image",
  );
  await upload.getByLabel("Evidence file").setInputFiles({
    name: "counts.csv",
    mimeType: "text/csv",
    buffer: Buffer.from('sample,E\n=HYPERLINK("x"),1\n'),
  });
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("alert")).toContainText("run as formulas");
  // Over the documented limit (UPLOAD_MAX_MB, 25 MB by default): told the limit, not a parsing error.
  const padded = (mb: number) => Buffer.concat([PDF, Buffer.alloc(mb * 1024 * 1024, 0x20)]);
  await upload
    .getByLabel("Evidence file")
    .setInputFiles({ name: "scan-26mb.pdf", mimeType: "application/pdf", buffer: padded(26) });
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("alert")).toContainText(/limit (of|is) 25\.0 MB/);
  await expect(page.getByText("No files attached.")).toBeVisible();
  // Under the limit but over the proxy's default 10 MB buffer: stored whole.
  await upload
    .getByLabel("Evidence file")
    .setInputFiles({ name: "scan-15mb.pdf", mimeType: "application/pdf", buffer: padded(15) });
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("status")).toContainText("scan-15mb.pdf uploaded");
});

test("a file counts once per run, the Sample field clears after an upload, and a file attached in error is detached with a reason", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/runs/new");
  await page.getByLabel("Part family").selectOption({ label: "PF-SF-12 · Straight fitting SF-12" });
  const fittingRecipe = await page
    .getByLabel("Recipe version")
    .locator("option", { hasText: /^R-SC1-SF v\d+ \(effective\)$/ })
    .textContent();
  await page.getByLabel("Recipe version").selectOption({ label: fittingRecipe! });
  await page.getByLabel("Test type").selectOption({ label: "Visual" });
  await page.getByLabel("Analysing lab").fill("Line 3 inspection");
  await page.getByRole("button", { name: "Open test run" }).click();
  const upload = page.getByRole("form", { name: "Upload evidence file" });
  await upload
    .getByLabel("Evidence file")
    .setInputFiles({ name: "SF12 report.pdf", mimeType: "application/pdf", buffer: PDF });
  await upload.getByLabel("Sample (optional)").fill("SF12-S1");
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("status")).toContainText("SF12 report.pdf uploaded");
  // The next file is usually another sample's: the label does not carry over.
  await expect(upload.getByLabel("Sample (optional)")).toHaveValue("");

  // The same bytes under another name would count twice.
  await upload
    .getByLabel("Evidence file")
    .setInputFiles({ name: "SF12 report (copy).pdf", mimeType: "application/pdf", buffer: PDF });
  await upload.getByRole("button", { name: "Upload" }).click();
  await expect(upload.getByRole("alert")).toContainText("already attached");
  await expect(upload.getByRole("alert")).toContainText("counts once");
  await expect(page.getByRole("link", { name: /^SF12 report/ })).toHaveCount(1);

  // The disclosure in the file's row (the column heading also reads "Detach" for screen readers).
  await page
    .getByRole("table", { name: "Evidence files" })
    .locator("summary", { hasText: "Detach" })
    .click();
  const detach = page.getByRole("form", { name: "Detach SF12 report.pdf" });
  await detach
    .getByLabel("Reason for detaching SF12 report.pdf")
    .fill("Report of another line, attached in error");
  await detach.getByRole("button", { name: "Detach file" }).click();
  await expect(page.getByText("No files attached.")).toBeVisible();
});

test("an engineer verifies the run from My queue; the outcome and code appear and the run is locked", async ({
  page,
}) => {
  test.skip(runUrl === "", "needs the run recorded above");
  await signInAs(page, "engineer");
  await page.goto("/queue");
  await page
    .getByRole("link", { name: new RegExp(`^${runNumber} · Particle cleanliness`) })
    .click();
  await expect(page).toHaveURL(runUrl);
  await page.getByRole("button", { name: "Sign as verified" }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(DEMO_PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1 }).locator("..")).toContainText(
    "Verified (locked)",
  );
  await expect(page.getByRole("heading", { name: /Computed outcome: Pass/ })).toBeVisible();
  await expect(page.getByTestId("run-ccc")).toContainText("A(");
  await expect(page.getByRole("table", { name: "Signatures" })).toContainText("Ines Varga");
  await expect(page.getByRole("button", { name: "Add sample" })).toHaveCount(0);

  const download = page.waitForEvent("download");
  await page.getByRole("link", { name: "VB210 lab report.pdf" }).click();
  expect((await download).suggestedFilename()).toBe("VB210 lab report.pdf");
});

test("the evidence table filters on the server and the trend chart renders", async ({
  page,
}, testInfo) => {
  await signInAs(page, "auditor");
  await page.goto("/evidence");
  const table = page.getByRole("table", { name: /Test runs/ });
  await expect(table.getByRole("row")).not.toHaveCount(1);
  await page.getByLabel("Outcome").selectOption({ label: "Fail" });
  await expect(page.getByText(/^\d+ runs? · page 1/)).toBeVisible();
  await expect(table.getByText("Pass")).toHaveCount(0);
  await expect(table.getByText("Fail").first()).toBeVisible();
  // The filter lives in the address: reloaded (or shared), the list is still filtered.
  await expect(page).toHaveURL(/[?&]outcome=fail\b/);
  await page.reload();
  await expect(page.getByLabel("Outcome")).toHaveValue("fail");
  await expect(table.getByText("Pass")).toHaveCount(0);
  // Each choice is a step of the browser's history: Back undoes the last one.
  await page.getByLabel("Outcome").selectOption({ label: "Pass" });
  await expect(page).toHaveURL(/[?&]outcome=pass\b/);
  await expect(table.getByText("Fail")).toHaveCount(0);
  await page.goBack();
  await expect(page).toHaveURL(/[?&]outcome=fail\b/);
  await expect(page.getByLabel("Outcome")).toHaveValue("fail");
  await expect(table.getByText("Pass")).toHaveCount(0);
  await expect(table.getByText("Fail").first()).toBeVisible();

  await page.getByRole("link", { name: "Trends" }).click();
  const choose = page.getByRole("form", { name: "Choose part family and recipe version" });
  const firstFamilyVersions = await choose
    .getByLabel("Recipe version")
    .locator("option")
    .allTextContents();
  // Choosing the family shows it at once, with its own versions (none from the family before).
  await choose.getByLabel("Part family").selectOption({ label: "PF-VB-210 · Valve body VB-210" });
  await expect(page).toHaveURL(/family=/);
  await expect(page).not.toHaveURL(/version=/);
  await expect(choose.getByLabel("Recipe version")).toBeEnabled();
  await expect(choose.getByLabel("Recipe version")).toHaveValue("");
  expect(await choose.getByLabel("Recipe version").locator("option").allTextContents()).not.toEqual(
    firstFamilyVersions,
  );
  const chart = page.getByRole("figure", { name: "Particle trend chart" });
  await expect(chart).toContainText(
    /\d+ run\(s\)(, on a logarithmic axis)?\. Dashed line: the specification limit/,
    { timeout: 30_000 },
  );
  await expect(chart.locator("path.recharts-line-curve")).toHaveCount(1, { timeout: 30_000 });
  await expect(chart.locator(".recharts-line-dot")).not.toHaveCount(0);
  // Counts far below the limit can be spread out on a logarithmic axis, and back.
  const ticks = chart.locator(".recharts-yAxis-tick-labels .recharts-cartesian-axis-tick-value");
  const logAxis = chart.getByLabel(/Logarithmic axis/);
  await logAxis.check();
  await expect(chart).toContainText("on a logarithmic axis");
  const powersOfTen = async () =>
    (await ticks.allTextContents()).every((t) => /^(0|0\.\d*1|1|10|100)(,000)*$/.test(t));
  await expect.poll(powersOfTen).toBe(true);
  await chart.screenshot({ path: testInfo.outputPath("trend-log.png") });
  await logAxis.uncheck();
  await expect(chart).not.toContainText("on a logarithmic axis");
  await expect.poll(powersOfTen).toBe(false);
  await chart.screenshot({ path: testInfo.outputPath("trend-linear.png") });
  // Back from another family: the choosers show the family the chart is of, not the one chosen after.
  const valveBody = await choose.getByLabel("Part family").inputValue();
  await choose
    .getByLabel("Part family")
    .selectOption({ label: "PF-SF-12 · Straight fitting SF-12" });
  await expect(page).not.toHaveURL(new RegExp(`family=${valveBody}`));
  await page.goBack();
  await expect(page).toHaveURL(new RegExp(`family=${valveBody}`));
  await expect(choose.getByLabel("Part family")).toHaveValue(valveBody);
  await expect(choose.getByLabel("Recipe version")).toBeEnabled();
  const control = page.getByRole("figure", { name: /Control chart: Detergent concentration/ });
  await expect(control).toContainText("Out of control:");
});

test("the bath log shows the isolation caution, records a reading and raises overdue maintenance", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/queue");
  await expect(page.getByRole("cell", { name: "Filter change" })).toBeVisible();
  await page
    .getByRole("link", { name: /AW-3 · Tank 1/ })
    .first()
    .click();
  await expect(page.getByRole("note").filter({ hasText: "isolate the machine" })).toBeVisible();
  const form = page.getByRole("form", { name: "Record in the bath log" });
  await form.getByLabel("Detergent concentration (%)").fill("3.05");
  await form.getByLabel("Bath temperature (°C)").fill("60.5");
  await form.getByRole("button", { name: "Record" }).click();
  await expect(form.getByRole("status")).toContainText("Recorded in the bath log.");
  await expect(page.getByRole("table", { name: "Bath log" })).toContainText("3.05 %");
});

test("the new-run form offers the protocols for the chosen part family and recipe version, and older versions on request", async ({
  page,
}) => {
  await signInAs(page, "technician");
  await page.goto("/evidence/runs/new?testType=gravimetric");
  const version = page.getByLabel("Recipe version");
  const protocol = page.getByLabel("Protocol (optional)");
  await expect(protocol).toBeDisabled();
  await expect(protocol).toHaveAccessibleDescription(/Choose the part family and recipe version/);
  await expect(version.locator("option", { hasText: "(superseded)" })).toHaveCount(0);

  // Results that arrive for an older version: the form lists every version, keeping the address's choices.
  await page.getByRole("link", { name: "Results for an older version?" }).click();
  await expect(page).toHaveURL(/testType=gravimetric&versions=all/);
  await expect(page.getByLabel("Test type")).toHaveValue("gravimetric");
  await expect(version.locator("option", { hasText: "(superseded)" })).not.toHaveCount(0);
  await page.getByLabel("Part family").selectOption({ label: "PF-VB-210 · Valve body VB-210" });
  // The versions the valve body was run or qualified with come first, the rest after them.
  const used = version.locator('optgroup[label="Used with PF-VB-210"]');
  await expect(used.locator("option", { hasText: /^R-AW3-VB v2 / })).toHaveCount(1);
  await expect(used.locator("option", { hasText: /^R-AW3-PH / })).toHaveCount(0);
  await expect(
    version.locator('optgroup[label="Other versions"] option', { hasText: /^R-AW3-PH / }),
  ).not.toHaveCount(0);
  const v2 = await version.locator("option", { hasText: /^R-AW3-VB v2 / }).textContent();
  await version.selectOption({ label: v2! });
  await expect(protocol).toBeEnabled();
  await expect(protocol.locator("option", { hasText: "OQ-AW3-0001" })).toHaveCount(1);
  await protocol.selectOption({
    label: "OQ-AW3-0001 · OQ of the three-tank aqueous washer for valve bodies",
  });

  // The OQ was written for the valve body on that version: another family is not offered it.
  await page.getByLabel("Part family").selectOption({ label: "PF-PH-400 · Pump housing PH-400" });
  await expect(protocol.locator("option", { hasText: "OQ-AW3-0001" })).toHaveCount(0);
  await page.getByRole("link", { name: "Show current versions only" }).click();
  await expect(page).toHaveURL(/\/evidence\/runs\/new\?testType=gravimetric$/);
});

test("the evidence list filters by recipe and by a version number of it", async ({ page }) => {
  await signInAs(page, "engineer");
  await page.goto("/evidence");
  const filters = page.getByRole("form", { name: "Filter test runs" });
  const version = filters.getByLabel("Version");
  await expect(version).toBeDisabled();
  await filters.getByLabel("Recipe").selectOption({ label: "R-AW3-VB" });
  await expect(version).toBeEnabled();
  await version.fill("2");
  await expect(page).toHaveURL(/version=2/);
  const table = page.getByRole("table", { name: /Test runs, \d+ found/ });
  const recipeCells = table.locator("tbody tr td:nth-child(4)");
  // Every row, once the list has answered (the rows before the filter stay shown while it asks).
  await expect(async () => {
    const texts = await recipeCells.allTextContents();
    expect(texts.length).toBeGreaterThan(0);
    for (const text of texts) expect(text).toBe("R-AW3-VB v2");
  }).toPass();
  // A version the recipe never had finds nothing, and says so.
  await version.fill("99");
  await expect(page.getByText("No test runs match these filters.")).toBeVisible();
  await version.fill("0");
  await expect(filters.getByText("Enter a whole version number from 1.")).toBeVisible();
  await expect(version).toHaveAttribute("aria-invalid", "true");
  // The typed version is one step of the history: Back returns to the recipe chosen before it.
  await page.goto("/evidence");
  await filters.getByLabel("Outcome").selectOption({ label: "Pass" });
  await filters.getByLabel("Recipe").selectOption({ label: "R-AW3-VB" });
  await version.pressSequentially("12");
  await expect(page).toHaveURL(/version=12/);
  await page.goBack();
  await expect(page).not.toHaveURL(/version=/);
  await expect(page).toHaveURL(/outcome=pass/);
  await expect(filters.getByLabel("Recipe")).not.toHaveValue("");
  await expect(version).toHaveValue("");

  // An old or edited address opens the list with what it can use, and the address is corrected.
  await page.goto("/evidence?outcome=maybe&sort=date&dir=sideways&page=-1&testType=gravimetric");
  await expect(table.locator("tbody tr").first()).toBeVisible();
  await expect(page.getByText("The list could not be loaded.")).toHaveCount(0);
  await expect(page).toHaveURL(/\/evidence\?testType=gravimetric$/);
  await expect(filters.getByLabel("Test type")).toHaveValue("gravimetric");

  // The date column is sorted newest first; one click on it turns the order round.
  await table.getByRole("button", { name: /^Date/ }).click();
  await expect(page).toHaveURL(/dir=asc/);
});
