import { execFileSync } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { expect, signInAs, test } from "./fixtures";

test("a customer's quality engineer finds every field of the test report of a verified demo run", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  // The demo's valve-body run with its lab details recorded, tested on 2026-02-10.
  await page.goto("/evidence?testType=particle_cleanliness&pageSize=100");
  const table = page.getByRole("table", { name: /Test runs/ });
  await table.getByRole("row").filter({ hasText: "2026-02-10" }).getByRole("link").first().click();
  await expect(page.getByRole("heading", { name: /Particle cleanliness/ })).toBeVisible();

  const [download] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("link", { name: "Download test report (PDF)" }).click(),
  ]);
  expect(download.suggestedFilename()).toMatch(/^TR-\d+-rev1-test-report\.pdf$/);
  const file = join(mkdtempSync(join(tmpdir(), "washproof-report-")), download.suggestedFilename());
  await download.saveAs(file);
  const text = execFileSync("pdftotext", ["-raw", file, "-"], { encoding: "utf8" }).replace(
    /\s+/g,
    " ",
  );
  for (const field of [
    "CONTROLLED COPY",
    "Larchfield",
    "VB-210-01",
    "L-2026-0207-3",
    "Wetted area determined From the CAD model",
    "Pressure rinsing",
    "1,500 mL",
    "PET mesh, pore size 5 µm",
    "Light microscope, automated",
    "50×",
    "Lower size limit 5 µm",
    "Declining test",
    "Blank counts",
    "Normalised (per 1000 cm²)",
    "Cleanliness code A(B",
    "Length 760 µm · width 18 µm",
    "Gravimetric residue",
    "CS-VB-01 revision C",
    "Deviations",
    "Performed by",
    "Verified by",
  ])
    expect(text).toContain(field);
  expect(text).toMatch(/Page 1 of \d+/);
  expect(text).toMatch(/Content hash \(SHA-256\) [0-9a-f]{64}/);
});
