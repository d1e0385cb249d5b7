import { expect, signInAs, test } from "./fixtures";

test("an administrator saves the requalification matrix as a new version; bad values keep what was typed", async ({
  page,
}) => {
  await signInAs(page, "admin");
  await page.goto("/admin/matrix");
  await expect(page.getByRole("heading", { name: "Requalification matrix" })).toBeVisible();
  await page.getByRole("button", { name: "Add row" }).click();
  const rows = page.getByRole("table", { name: "Matrix rows" }).getByRole("row");
  const n = (await rows.count()) - 1;
  await page
    .getByLabel(`Subject of row ${n}`)
    .selectOption({ label: "Parameter: filter interval" });
  await page.getByLabel(`Test of row ${n}`).selectOption({ label: "Gravimetric residue" });
  await page.getByLabel(`Reliability of row ${n}`).fill("100");
  await page.getByRole("button", { name: "Save as new version" }).click();
  await expect(page.getByText("Reliability below 100 %.")).toBeVisible();
  await expect(page.getByLabel(`Reliability of row ${n}`)).toHaveValue("100");

  await page.getByLabel(`Reliability of row ${n}`).fill("95");
  await expect(rows.nth(n)).toContainText("59 parts");
  await page
    .getByLabel("What changed and why")
    .fill("Filter interval changes also need a gravimetric check");
  await page.getByRole("button", { name: "Save as new version" }).click();
  await expect(page.getByText(/Saved as version 2/)).toBeVisible();
  await expect(page.getByRole("region", { name: "Versions" })).toContainText(
    "Version 1 · Superseded",
  );
});

test("an administrator adding a stage to a washer that runs an effective recipe opens an equipment change request; the washer keeps its stages until it closes", async ({
  page,
  browser,
}) => {
  await signInAs(page, "admin");
  await page.goto("/systems");
  await page.getByRole("link", { name: "SC-1 · Single-chamber spray washer" }).click();
  await page.getByText("Edit system and stages").click();
  await page.getByRole("button", { name: "Add stage" }).click();
  await page.getByRole("button", { name: "Save system" }).click();
  await expect(page.getByText("Tick at least one mode the stage can run.")).toBeVisible();
  await page.getByLabel("Name of stage 4").fill("Deionised rinse");
  await page.getByLabel("Kind of stage 4").selectOption({ label: "Final rinse" });
  await page.getByRole("group", { name: "Stage 4 can run" }).getByLabel("Spray").check();
  await page.getByLabel("Tank volume of stage 4 (L)").fill("300");
  await page.getByLabel("Spray pressure of stage 4 (bar)").fill("2");
  // Stages run in process order: the final rinse goes before the dryer.
  await page.getByRole("button", { name: "Move stage 4 up" }).click();
  await page.getByRole("button", { name: "Save system" }).click();
  // SC-1 runs R-SC1-SF v2: its validation rests on the equipment as it is.
  // Saving diffs the washer against every recipe it runs and opens the change: on a loaded machine that
  // and the redirect can take longer than one ordinary expectation.
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Equipment change on SC-1", {
    timeout: 30_000,
  });
  const diff = page.getByRole("table", { name: "Equipment diff, SC-1" });
  await expect(diff.getByRole("row", { name: /Deionised rinse/ })).toContainText("Major");
  const changeUrl = page.url();
  await page.goto("/systems");
  await expect(page.getByRole("table", { name: /Stages of Single-chamber/ })).not.toContainText(
    "Deionised rinse",
  );

  // The engineer withdraws it, so the spray-fitting recipe is free for the other tests.
  const engineer = await browser.newPage();
  await signInAs(engineer, "engineer");
  await engineer.goto(changeUrl);
  await engineer.getByRole("button", { name: "Withdraw" }).click();
  await engineer
    .getByRole("dialog")
    .getByLabel("Reason")
    .fill("Raised from the browser test only.");
  await engineer.getByRole("dialog").getByRole("button", { name: "Withdraw" }).click();
  await expect(engineer.getByRole("heading", { level: 1 }).locator("..")).toContainText(
    "Withdrawn",
  );
  await engineer.close();
});
