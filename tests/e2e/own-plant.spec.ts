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
