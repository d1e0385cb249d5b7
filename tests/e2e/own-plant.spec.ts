import type { Browser, Page } from "@playwright/test";
import { expect, signIn, test } from "./fixtures";

/*
 * Runs in the "own-plant" project only (playwright.config.ts): its own server on an EMPTY database
 * (scripts/e2e-server.ts --empty, data/e2e-empty/, port E2E_PORT + 2), never the seeded demo.
 * One walk, in order, because each step needs the one before: the installation is set up once.
 * Company, people and washer are invented.
 */
const ADMIN = {
  name: "Odile Marchetti",
  email: "odile@harrowgate.example",
  password: "Violet-gantry-Kestrel-48",
};

test("a plant starts from nothing: set-up page, first administrator signs in, creates a four-stage washer; bad input is refused beside its field", async ({
  page,
}) => {
  test.setTimeout(120_000);

  await test.step("the sign-in page of an empty installation leads to the one-time set-up page", async () => {
    await page.goto("/sign-in");
    await expect(page).toHaveURL(/\/set-up$/);
    await expect(page.getByRole("heading", { level: 1, name: "Set up Washproof" })).toBeVisible();
  });

  await test.step("set-up refuses passwords that differ, keeping what was typed, then creates the company, site and administrator", async () => {
    await page.getByLabel("Company name", { exact: true }).fill("Harrowgate Hydraulik GmbH");
    await page.getByLabel("Site name", { exact: true }).fill("Werk Tallbrook");
    await page.getByLabel("Full name", { exact: true }).fill(ADMIN.name);
    await page.getByLabel("E-mail", { exact: true }).fill(ADMIN.email);
    await page.getByLabel("Password", { exact: true }).fill(ADMIN.password);
    await page.getByLabel("Repeat the password", { exact: true }).fill(`${ADMIN.password}x`);
    await page.getByRole("button", { name: "Set up and continue to sign in" }).click();
    await expect(
      page.getByLabel("Repeat the password", { exact: true }),
    ).toHaveAccessibleDescription(/The two passwords differ/);
    await expect(page.getByLabel("Company name", { exact: true })).toHaveValue(
      "Harrowgate Hydraulik GmbH",
    );

    await page.getByLabel("Repeat the password", { exact: true }).fill(ADMIN.password);
    await page.getByRole("button", { name: "Set up and continue to sign in" }).click();
    await expect(page).toHaveURL(/\/sign-in\?set-up=done$/);
    await expect(page.getByRole("status")).toContainText("The installation is set up.");
  });

  await test.step("the set-up page is closed once used", async () => {
    await page.goto("/set-up");
    await expect(page).toHaveURL(/\/sign-in$/);
  });

  await test.step("the administrator signs in", async () => {
    await signIn(page, ADMIN.email, ADMIN.password);
    await expect(page.getByRole("banner")).toContainText(ADMIN.name);
  });

  await test.step("the administrator fills in a four-stage washer, stages out of process order are refused beside the field", async () => {
    await page.goto("/systems");
    await expect(page.getByRole("heading", { name: "No cleaning systems" })).toBeVisible();
    await page.getByRole("link", { name: "New cleaning system" }).click();
    await expect(
      page.getByRole("heading", { level: 1, name: "New cleaning system" }),
    ).toBeVisible();

    await page.getByLabel("Short code", { exact: true }).fill("AW-1");
    await page.getByLabel("Asset number", { exact: true }).fill("WX-0001");
    await page.getByLabel("System name", { exact: true }).fill("Four-tank washer");
    // The plant has one site: it is already chosen.
    await expect(page.getByLabel("Site", { exact: true })).toHaveValue(/.+/);

    await page.getByLabel("Name of stage 1", { exact: true }).fill("Ultrasonic wash");
    await page.getByLabel("Tank volume of stage 1 (L)", { exact: true }).fill("600");
    await page.getByLabel("Filter rating of stage 1 (µm)", { exact: true }).fill("25");
    await page
      .getByRole("group", { name: "Stage 1 can run" })
      .getByLabel("Ultrasonic", { exact: true })
      .check();
    await page
      .getByRole("group", { name: "Stage 1 can run" })
      .getByLabel("Flood", { exact: true })
      .check();
    await page.getByLabel("Ultrasonic power of stage 1 (W)", { exact: true }).fill("6000");
    await page.getByLabel("Ultrasonic frequency of stage 1 (kHz)", { exact: true }).fill("40");
    await expect(
      page.getByRole("note").filter({ hasText: "Caution: ultrasonic noise" }),
    ).toBeVisible();
    await expect(
      page.getByRole("note").filter({ hasText: "Caution: filter changes" }),
    ).toBeVisible();

    await page.getByRole("button", { name: "Add stage" }).click();
    await page.getByLabel("Name of stage 2", { exact: true }).fill("Spray rinse");
    await page.getByLabel("Kind of stage 2", { exact: true }).selectOption({ label: "Rinse" });
    await page.getByLabel("Tank volume of stage 2 (L)", { exact: true }).fill("500");
    await page
      .getByRole("group", { name: "Stage 2 can run" })
      .getByLabel("Spray", { exact: true })
      .check();
    await page.getByLabel("Spray pressure of stage 2 (bar)", { exact: true }).fill("4");

    // The dryer typed before the final rinse.
    await page.getByRole("button", { name: "Add stage" }).click();
    await page.getByLabel("Name of stage 3", { exact: true }).fill("Hot-air dryer");
    await page.getByLabel("Kind of stage 3", { exact: true }).selectOption({ label: "Drying" });
    await page
      .getByRole("group", { name: "Stage 3 can run" })
      .getByLabel("Hot-air drying", { exact: true })
      .check();

    await page.getByRole("button", { name: "Add stage" }).click();
    await page.getByLabel("Name of stage 4", { exact: true }).fill("Deionised rinse");
    await page
      .getByLabel("Kind of stage 4", { exact: true })
      .selectOption({ label: "Final rinse" });
    await page.getByLabel("Tank volume of stage 4 (L)", { exact: true }).fill("400");
    await page
      .getByRole("group", { name: "Stage 4 can run" })
      .getByLabel("Flood", { exact: true })
      .check();

    await page.getByRole("button", { name: "Create system" }).click();
    await expect(page.getByLabel("Kind of stage 4", { exact: true })).toHaveAccessibleDescription(
      /Stage 4 \(Deionised rinse\) is a final rinse after stage 3 \(Hot-air dryer\)/,
    );
    // Nothing typed is lost.
    await expect(page.getByLabel("Name of stage 4", { exact: true })).toHaveValue(
      "Deionised rinse",
    );
    await expect(page.getByLabel("Ultrasonic power of stage 1 (W)", { exact: true })).toHaveValue(
      "6000",
    );
    await expect(page.getByLabel("Short code", { exact: true })).toHaveValue("AW-1");
  });

  await test.step("moved into process order, the washer is created and listed", async () => {
    await page.getByRole("button", { name: "Move stage 4 up" }).click();
    await expect(page.getByLabel("Name of stage 3", { exact: true })).toHaveValue(
      "Deionised rinse",
    );
    await expect(page.getByLabel("Name of stage 4", { exact: true })).toHaveValue("Hot-air dryer");
    await page.getByRole("button", { name: "Create system" }).click();
    await expect(
      page.getByRole("heading", { level: 1, name: "AW-1 · Four-tank washer" }),
    ).toBeVisible();

    await page.goto("/systems");
    await expect(page.getByRole("link", { name: "AW-1 · Four-tank washer" })).toBeVisible();
    const stages = page.getByRole("table", { name: "Stages of Four-tank washer" });
    await expect(stages.getByRole("row")).toHaveCount(5); // heading row + four stages
    for (const name of ["Ultrasonic wash", "Spray rinse", "Deionised rinse", "Hot-air dryer"])
      await expect(stages).toContainText(name);
  });

  await test.step("a second washer with the same asset number is refused beside the field, keeping what was typed", async () => {
    await page.getByRole("link", { name: "New cleaning system" }).click();
    await page.getByLabel("Short code", { exact: true }).fill("SC-2");
    await page.getByLabel("Asset number", { exact: true }).fill("WX-0001");
    await page
      .getByLabel("Kind of system", { exact: true })
      .selectOption({ label: "Single-chamber spray washer" });
    await page.getByLabel("System name", { exact: true }).fill("Spray cabinet");
    await page.getByLabel("Name of stage 1", { exact: true }).fill("Spray wash");
    await page
      .getByRole("group", { name: "Stage 1 can run" })
      .getByLabel("Spray", { exact: true })
      .check();
    await page.getByLabel("Spray pressure of stage 1 (bar)", { exact: true }).fill("3");
    await page.getByRole("button", { name: "Create system" }).click();
    await expect(page.getByLabel("Asset number", { exact: true })).toHaveAccessibleDescription(
      /Asset number WX-0001 is already system AW-1's\./,
    );
    await expect(page.getByLabel("Short code", { exact: true })).toHaveValue("SC-2");
    await expect(page.getByLabel("Spray pressure of stage 1 (bar)", { exact: true })).toHaveValue(
      "3",
    );
    await page.goto("/systems");
    await expect(page.getByRole("link", { name: /Spray cabinet/ })).toHaveCount(0);
  });
});

/* The plant's own people, created by its administrator (invented names, none a demo user's). */
const PEOPLE = {
  engineer: {
    name: "Anouk Ferreira",
    email: "anouk@harrowgate.example",
    role: /^Quality engineer/,
  },
  approver: { name: "Bastian Oyelaran", email: "bastian@harrowgate.example", role: /Approver/ },
  reviewer: { name: "Carys Lindholm", email: "carys@harrowgate.example", role: /Reviewer/ },
  technician: { name: "Dario Kettunen", email: "dario@harrowgate.example", role: /Technician/ },
} as const;
type Person = keyof typeof PEOPLE;
const PASSWORD = "Copper-sluice-Heron-73";

async function as(browser: Browser, who: Person, url: string) {
  const page = await browser.newPage();
  await signIn(page, PEOPLE[who].email, PASSWORD);
  await expect(page.getByRole("banner")).toContainText(PEOPLE[who].name);
  await page.goto(url);
  return page;
}

async function sign(page: Page, button: string) {
  await page.getByRole("button", { name: button }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Your password").fill(PASSWORD);
  await dialog.getByRole("button", { name: "Sign", exact: true }).click();
}

const SPEC_CSV = [
  "code,name,customer,document_number,revision,ccc,gravimetric_limit_mg,gravimetric_basis",
  "CS-HH-01,Valve housings,Kestrel Pumps,KP-CL-100,B,A(B-E17/F-G14/H-N00),2.0,per_component",
].join("\n");
const FAMILIES_CSV = [
  "code,name,part_numbers,material,wetted_area_cm2,wetted_area_method,spec_code",
  "PF-VH-1,Valve housing VH-1,VH-1-01;VH-1-02,Aluminium 6082,310,cad_model,CS-HH-01",
  "PF-VH-2,Valve housing VH-2,VH-2-01,Aluminium 6082,295,measured,CS-HH-01",
].join("\n");
// AW-1's stages and modes; setpoints inside their own ranges [practice: typical aqueous-washer settings].
const RECIPE_CSV = [
  "stage,stage_kind,stage_mode,key,name,kind,setpoint,unit,validated_low,validated_high,critical",
  "Ultrasonic wash,wash,ultrasonic,wash.temperature,Bath temperature,temperature,60,°C,55,65,yes",
  "Ultrasonic wash,wash,ultrasonic,wash.time,Wash time,time,300,s,240,360,yes",
  "Spray rinse,rinse,spray,rinse.time,Rinse time,time,90,s,60,120,no",
  "Deionised rinse,final_rinse,flood,final.conductivity,Rinse conductivity limit,conductivity_limit,20,µS/cm,,30,yes",
  "Hot-air dryer,drying,hot_air_drying,drying.temperature,Drying temperature,drying_temperature,90,°C,80,100,yes",
].join("\n");
// Residue about 1.2 mg per part against 2.0 mg per component, blank 0.06 mg within 10 % of the limit [ISO 16232 blank rule].
const GRAVIMETRIC_CSV = [
  "Part serial,Worst case,Parts,Cycle,Tare (mg),Gross (mg),Blank (mg)",
  "VH1-IV-01,yes,1,AW1-IV-1,12.40,13.60,0.06",
  "VH1-IV-02,no,1,AW1-IV-2,12.41,13.66,0.06",
].join("\n");

test("from master data to the first run: CSV part families and specification, a recipe by CSV, its initial validation to effective, a run on the qualified combination and a refusal on another", async ({
  page,
  browser,
}) => {
  test.setTimeout(300_000);
  const started = Date.now();

  await test.step("the administrator creates the plant's people and a requalification matrix", async () => {
    await signIn(page, ADMIN.email, ADMIN.password);
    await expect(page).toHaveURL(/\/overview/);
    for (const who of Object.keys(PEOPLE) as Person[]) {
      await page.goto("/admin/users/new");
      await page.getByLabel("Full name").fill(PEOPLE[who].name);
      await page.getByLabel("E-mail").fill(PEOPLE[who].email);
      await page.getByRole("checkbox", { name: PEOPLE[who].role }).check();
      await page.getByRole("button", { name: "Create user" }).click();
      const temporary = (await page.getByTestId("temporary-password").textContent())!;
      const first = await browser.newPage();
      await signIn(first, PEOPLE[who].email, temporary);
      await expect(first).toHaveURL(/\/account\/password$/);
      await first.getByLabel("Current password").fill(temporary);
      await first.getByLabel("New password", { exact: true }).fill(PASSWORD);
      await first.getByLabel("New password again").fill(PASSWORD);
      await first.getByRole("button", { name: "Change password" }).click();
      // Engineers land on the plant overview, the others on My queue.
      await expect(first).toHaveURL(who === "engineer" ? /\/overview/ : /\/queue/);
      await first.close();
    }
    // A deliberately small matrix: a new part family calls for a gravimetric test on 2 parts (60 % / 60 %).
    await page.goto("/admin/matrix");
    await page.getByRole("button", { name: "Add row" }).click();
    await page
      .getByLabel("Subject of row 1")
      .selectOption({ label: "New part family on the recipe" });
    await page.getByLabel("Test of row 1").selectOption({ label: "Gravimetric residue" });
    await page.getByLabel("Confidence of row 1").fill("60");
    await page.getByLabel("Reliability of row 1").fill("60");
    // Independent samples: the two parts come from two wash cycles.
    await page.getByLabel("Distinct cycles of row 1").fill("2");
    await page
      .getByLabel("What changed and why")
      .fill("First matrix of the plant, for its first validation");
    await page.getByRole("button", { name: "Save as new version" }).click();
    await expect(page.getByText(/Saved as version 1/)).toBeVisible();
  });

  const engineer = await as(browser, "engineer", "/parts/import");
  await test.step("the engineer imports a customer specification and two part families by CSV", async () => {
    const importer = engineer.getByRole("form", { name: "Import specifications from CSV" });
    await engineer.getByRole("radio", { name: "Specifications" }).check();
    await importer
      .getByLabel("CSV file of specifications")
      .setInputFiles({ name: "specs.csv", mimeType: "text/csv", buffer: Buffer.from(SPEC_CSV) });
    await importer.getByRole("button", { name: "Import" }).click();
    await expect(importer.getByRole("status")).toHaveText("1 specification imported.");

    await engineer.getByRole("radio", { name: "Part families" }).check();
    const families = engineer.getByRole("form", { name: "Import part families from CSV" });
    await families.getByLabel("CSV file of part families").setInputFiles({
      name: "families.csv",
      mimeType: "text/csv",
      buffer: Buffer.from(FAMILIES_CSV),
    });
    await families.getByRole("button", { name: "Import" }).click();
    await expect(families.getByRole("status")).toHaveText("2 part families imported.");
  });

  await test.step("the engineer imports the recipe for AW-1 by CSV and routes its initial validation", async () => {
    await engineer.goto("/systems");
    await engineer.getByRole("link", { name: "AW-1 · Four-tank washer" }).click();
    await engineer.getByRole("link", { name: "Import a recipe from CSV" }).click();
    const importer = engineer.getByRole("form", { name: "Import a recipe from CSV" });
    await importer.getByLabel("Recipe code").fill("R-AW1-VH");
    await importer.getByLabel("Recipe name").fill("Valve housing, ultrasonic");
    await importer.getByLabel("CSV file of the recipe's stages and parameters").setInputFiles({
      name: "r-aw1-vh.csv",
      mimeType: "text/csv",
      buffer: Buffer.from(RECIPE_CSV),
    });
    await importer.getByRole("button", { name: "Import" }).click();
    await expect(engineer.getByRole("heading", { level: 1 })).toContainText("R-AW1-VH");

    await engineer
      .getByLabel("Validation title")
      .fill("Initial validation for valve housings VH-1");
    await engineer
      .getByLabel("Part family validated for")
      .selectOption({ label: "PF-VH-1 Valve housing VH-1" });
    await engineer.getByRole("button", { name: "Route for initial validation" }).click();
    await expect(engineer.getByRole("heading", { level: 1 })).toContainText(
      "Initial validation for valve housings VH-1",
    );
    const narrative = engineer.getByRole("textbox", { name: "Document text" });
    await narrative.click();
    await engineer.keyboard.type(
      "First recipe for VH-1 on AW-1. Risk: residue above the customer's limit; proven by gravimetric test.",
    );
    await expect(
      engineer
        .getByRole("region", { name: "Justification and risk assessment" })
        .getByRole("status"),
    ).toContainText("All changes saved");
    const required = engineer.getByRole("table", { name: "Required tests" });
    await expect(required.getByRole("row", { name: /Gravimetric residue 2 parts/ })).toBeVisible();
    // The signature binds to the change as shown: read it again with the justification saved.
    await engineer.reload();
    await sign(engineer, "Sign and submit impact assessment");
    await expect(engineer.getByRole("heading", { level: 1 }).locator("..")).toContainText(
      "Impact assessed",
    );
  });
  const changeUrl = engineer.url();
  const changeLabel = `${((await engineer.getByRole("heading", { level: 1 }).textContent()) ?? "").split(" ")[0]} · Initial validation for valve housings VH-1`;

  await test.step("approved, requalified with a verified gravimetric run, verified and closed: the recipe is effective", async () => {
    const approver = await as(browser, "approver", changeUrl);
    await sign(approver, "Approve for implementation");
    await expect(approver.getByRole("heading", { level: 1 }).locator("..")).toContainText(
      "Approved",
    );
    await approver.close();

    await engineer.reload();
    await engineer.getByRole("button", { name: "Start requalification" }).click();
    await expect(
      engineer.getByRole("heading", { name: "Requalification gate: not met" }),
    ).toBeVisible();

    const tech = await as(browser, "technician", "/evidence");
    await tech.getByRole("link", { name: "New test run" }).click();
    await tech.getByLabel("Part family").selectOption({ label: "PF-VH-1 · Valve housing VH-1" });
    await tech.getByLabel("Recipe version").selectOption({ label: "R-AW1-VH v1 (proposed)" });
    await tech.getByLabel("Test type").selectOption({ label: "Gravimetric" });
    await tech.getByLabel("Analysing lab").fill("Tallbrook works lab");
    await tech
      .getByLabel("Change request (optional)", { exact: true })
      .selectOption({ label: changeLabel });
    await tech
      .getByLabel("Requirement of the change request (optional)")
      .fill("Gravimetric residue on 2 parts");
    await tech.getByRole("button", { name: "Open test run" }).click();
    await expect(tech.getByRole("heading", { level: 1 })).toContainText("Gravimetric");
    const runUrl = tech.url();
    const importer = tech.getByRole("form", { name: "Import filter weighings from CSV" });
    await importer.getByLabel(/^CSV file of/).setInputFiles({
      name: "vh1-gravimetric.csv",
      mimeType: "text/csv",
      buffer: Buffer.from(GRAVIMETRIC_CSV),
    });
    await expect(importer.getByRole("group", { name: "Match the file's columns" })).toBeVisible();
    await importer.getByLabel("Filter mass before (mg)").selectOption("Tare (mg)");
    await importer.getByLabel("Filter mass after (mg)").selectOption("Gross (mg)");
    await importer.getByLabel("Blank residue (mg)").selectOption("Blank (mg)");
    await importer.getByRole("button", { name: "Import" }).click();
    await expect(importer.getByRole("status")).toHaveText(
      "2 sample(s) imported from vh1-gravimetric.csv.",
    );
    await expect(tech.getByRole("heading", { name: /Computed outcome: Pass/ })).toBeVisible();
    await sign(tech, "Sign as performed");
    await expect(tech.getByRole("heading", { level: 1 }).locator("..")).toContainText("Performed");
    await tech.close();

    // A second person verifies the run.
    await engineer.goto(runUrl);
    await sign(engineer, "Sign as verified");
    await expect(engineer.getByRole("heading", { level: 1 }).locator("..")).toContainText(
      "Verified (locked)",
    );

    const reviewer = await as(browser, "reviewer", changeUrl);
    await expect(
      reviewer.getByRole("heading", { name: "Requalification gate: met" }),
    ).toBeVisible();
    await sign(reviewer, "Verify change");
    await expect(reviewer.getByRole("heading", { level: 1 }).locator("..")).toContainText(
      "Verified",
    );
    await reviewer.close();

    const closer = await as(browser, "approver", changeUrl);
    await closer.getByRole("button", { name: "Close and make effective" }).click();
    await expect(closer.getByText("version 1 is effective.")).toBeVisible();
    await closer.close();
  });

  await test.step("a technician opens a run on the qualified combination and is refused on one that is not", async () => {
    const tech = await as(browser, "technician", "/evidence");
    await tech.getByRole("link", { name: "New test run" }).click();
    await tech.getByLabel("Part family").selectOption({ label: "PF-VH-2 · Valve housing VH-2" });
    await tech.getByLabel("Recipe version").selectOption({ label: "R-AW1-VH v1 (effective)" });
    await tech.getByLabel("Test type").selectOption({ label: "Gravimetric" });
    await tech.getByLabel("Analysing lab").fill("Tallbrook works lab");
    await tech.getByRole("button", { name: "Open test run" }).click();
    await expect(tech.getByLabel("Recipe version")).toHaveAccessibleDescription(
      /PF-VH-2 is not qualified on R-AW1-VH v1/,
    );

    await tech.getByLabel("Part family").selectOption({ label: "PF-VH-1 · Valve housing VH-1" });
    await tech.getByRole("button", { name: "Open test run" }).click();
    await expect(tech.getByRole("heading", { level: 1 })).toContainText("Gravimetric");
    await tech.close();
  });
  await engineer.close();

  console.log(
    `own plant: master data to the first run on a qualified combination in ${((Date.now() - started) / 1000).toFixed(1)} s`,
  );
});
