import { readFileSync } from "node:fs";
import { expect, signInAs, test } from "./fixtures";

test("an auditor filters the audit trail, verifies its integrity and exports it", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  await page.getByRole("link", { name: "Trace" }).click();
  await page
    .getByRole("navigation", { name: "Trace" })
    .getByRole("link", { name: "Audit trail" })
    .click();
  await expect(page.getByRole("heading", { name: "Audit trail" })).toBeVisible();

  // The first page of events has loaded, so the browser is hydrated and filtering runs in the page.
  await expect(page.getByRole("table").getByRole("row").nth(1)).toBeVisible({ timeout: 30_000 });
  const filters = page.getByRole("form", { name: "Filter the audit trail" });
  await filters.getByLabel("Event").selectOption("part_family.created");
  await filters.getByRole("button", { name: "Filter" }).click();
  const rows = page.getByRole("table").getByRole("row");
  await expect(rows).toHaveCount(4); // header + the three seeded part families
  await expect(page.getByRole("table")).toContainText("PF-PH-400");
  // The filter is in the address: a reload (or a shared link) shows the same events.
  await expect(page).toHaveURL(/[?&]eventType=part_family\.created\b/);
  await page.reload();
  await expect(filters.getByLabel("Event")).toHaveValue("part_family.created");
  await expect(rows).toHaveCount(4, { timeout: 30_000 });

  await page.getByRole("button", { name: "Verify integrity" }).click();
  await expect(page.getByRole("status")).toContainText(/Intact: all \d+ events verified/);

  const download = page.waitForEvent("download");
  await page.getByRole("link", { name: "CSV" }).click();
  const file = await (await download).path();
  const csv = readFileSync(file, "utf8");
  expect(csv.split("\r\n")[0]).toBe(
    "seq,at_utc,actor,action,record_type,record_id,old_value,new_value,reason,prev_hash,hash",
  );
  expect(csv.match(/part_family\.created/g)).toHaveLength(3);
});

test("an engineer sees no audit-trail tab and is refused the page and its data", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  await page.goto("/trace");
  await expect(
    page
      .getByRole("navigation", { name: "Trace" })
      .getByRole("link", { name: "Parameter history" }),
  ).toBeVisible();
  await expect(
    page.getByRole("navigation", { name: "Trace" }).getByRole("link", { name: "Audit trail" }),
  ).toHaveCount(0);
  expect((await page.goto("/trace/audit"))?.status()).toBe(403);
  const api = await page.request.get("/api/audit-events");
  expect(api.status()).toBe(403);
  expect(await api.json()).toEqual({ error: "Your role does not allow this." });
});

test("bad filters get a clear JSON error", async ({ page }) => {
  await signInAs(page, "auditor");
  const response = await page.request.get("/api/audit-events?from=yesterday");
  expect(response.status()).toBe(400);
  const body = await response.json();
  expect(body.error).toBe("Some filters are not valid.");
  expect(body.fieldErrors.from).toBeDefined();
});
