import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import type { Page } from "@playwright/test";
import { strFromU8, unzipSync } from "fflate";
import { DEMO, expect, signInAs, test, type DemoRole } from "./fixtures";

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/** Through the user menu in the banner, as a person finds their tokens. */
async function createToken(
  page: Page,
  role: DemoRole,
  name: string,
  scope: "Read" | "Read and write",
) {
  await page.getByRole("banner").getByText(DEMO[role].name).click();
  await page.getByRole("link", { name: "API tokens" }).click();
  const form = page.getByRole("form", { name: "Create API token" });
  await form.getByLabel("Name").fill(name);
  await form.getByRole("radio", { name: new RegExp(`^${scope}:`) }).check();
  await form.getByRole("button", { name: "Create token" }).click();
  const token = (await form.getByTestId("new-api-token").textContent())!.trim();
  expect(token).toMatch(/^wpk_/);
  return token;
}

test("an auditor traces the fitting's drying temperature to its change, signatures and evidence, and downloads the audit pack", async ({
  page,
}, testInfo) => {
  test.setTimeout(120_000);
  await signInAs(page, "auditor");
  await page.getByRole("navigation").getByRole("link", { name: "Trace" }).click();
  await page
    .getByLabel("Cleaning system")
    .selectOption({ label: "SC-1 · Single-chamber spray washer" });
  await page.getByLabel("Recipe").selectOption({ label: "R-SC1-SF · Fitting, spray" });
  // The list narrows as each letter is typed.
  const matches = page.getByRole("list", { name: "Matching parameters" });
  const search = page.getByLabel("Search parameters");
  await search.pressSequentially("dry");
  await expect(matches.getByRole("link")).toHaveCount(2);
  await search.pressSequentially(" temp");
  await expect(matches.getByRole("link")).toHaveCount(1);
  await matches.getByRole("link", { name: /Drying temperature drying\.temperature/ }).click();
  await expect(page).toHaveURL(/key=drying\.temperature/);
  // The tab names the recipe and the parameter traced; a key the recipe never had names nothing.
  await expect(page).toHaveTitle(/^Trace R-[A-Z0-9-]+ drying\.temperature · Washproof$/);
  const traced = page.url();
  await page.goto(traced.replace("key=drying.temperature", "key=drying.nothing"));
  await expect(page).toHaveTitle("Trace · Washproof");
  await page.goto(traced);
  // The chooser's filter is in the address: after choosing, and after a reload, it is still there.
  await expect(page).toHaveURL(/q=dry\+temp/);
  await page.reload();
  await expect(page.getByLabel("Search parameters")).toHaveValue("dry temp");
  await expect(page.getByLabel("Recipe")).toHaveValue(/^[0-9a-f-]{36}$/);
  await expect(matches.getByRole("link")).toHaveCount(1);

  // Values, ranges and periods from the demo's CR-2026-001 [db/seed-changes.ts].
  const before = page.getByRole("article", { name: "Version 1: 90 °C" });
  await expect(before).toContainText("80–100 °C");
  await expect(before).toContainText("from 2025-06-02 07:00 UTC to 2026-06-15 07:00 UTC");
  // The first version took force in 2025 and was proven by the fitting's PQ, whatever day the demo was loaded.
  const origin = before.getByRole("region", { name: "How this value took force" });
  await expect(origin).toContainText("first validated version, took force on 2025-06-02");
  await expect(origin).toContainText("Fitting PQ (first validation), qualified 2025-06-02");
  const entry = page.getByRole("article", { name: "Version 2: 105 °C" });
  await expect(entry).toContainText("90 °C → 105 °C");
  await expect(entry).toContainText("80–100 °C → 95–110 °C");
  await expect(entry).toContainText("from 2026-06-15 07:00 UTC until now");

  const change = entry.getByRole("region", { name: "Change request CR-2026-001" });
  await expect(change).toContainText(
    "Dry fittings at 105 °C to clear water from the thread roots · Closed · impact Major",
  );
  await expect(change).toContainText("This parameter: outside the validated range · Major");
  await expect(change.getByRole("blockquote")).toContainText(
    "Customer audit found residual water in the thread roots of SF-12 fittings after 15 min.",
  );
  const signatures = change.getByRole("table", { name: "Signatures on CR-2026-001" });
  for (const [meaning, name] of [
    ["Authored", DEMO.engineer.name],
    ["Approved", DEMO.approver.name],
    ["Verified", DEMO.reviewer.name],
  ]) {
    await expect(
      signatures.getByRole("row", { name: new RegExp(`^${meaning} ${name} `) }),
    ).toContainText("Valid");
  }

  // Drying → dryness and visual, 29 parts each at 95 % / 90 % [derived, standards.md §4].
  await expect(change).toContainText("Required: Dryness on 29 parts; Visual (stains) on 29 parts.");
  const evidence = change.getByRole("list", { name: "Evidence for CR-2026-001" });
  const runItems = evidence.locator(":scope > li");
  await expect(runItems).toHaveCount(2);
  const hashes: Record<string, string[]> = {};
  for (const run of ["RQ-2026-001", "RQ-2026-002"]) {
    const item = runItems.filter({ has: page.getByRole("link", { name: run, exact: true }) });
    await expect(item).toContainText(
      "computed outcome Pass · Verified · 29 samples (6 at worst-case positions)",
    );
    await expect(item).toContainText(
      `Performed by ${DEMO.technician.name}, 2026-06-08 15:00 UTC · Verified by ${DEMO.engineer.name}, 2026-06-10 09:00 UTC`,
    );
    hashes[run] = (
      await item
        .getByRole("list", { name: `Files of ${run}` })
        .getByRole("listitem")
        .allTextContents()
    ).map((t) => t.match(/SHA-256 ([0-9a-f]{64})/)![1]);
    expect(hashes[run]).toHaveLength(2);
  }

  // Follow to the evidence: the run's own page computes the same outcome, and its signatures still bind.
  await evidence.getByRole("link", { name: "RQ-2026-001" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("RQ-2026-001");
  await expect(page.getByRole("heading", { name: /Computed outcome: Pass/ })).toBeVisible();
  const runSignatures = page.getByRole("table", { name: "Signatures" });
  await expect(
    runSignatures.getByRole("row", {
      name: new RegExp(`Performed ${DEMO.technician.name} .* Valid`),
    }),
  ).toBeVisible();
  await expect(
    runSignatures.getByRole("row", { name: new RegExp(`Verified ${DEMO.engineer.name} .* Valid`) }),
  ).toBeVisible();
  const files = page.getByRole("table", { name: "Evidence files" });
  for (const h of hashes["RQ-2026-001"])
    await expect(files.locator(`[title="${h}"]`)).toHaveText(`${h.slice(0, 12)}…`);
  const photo = page.waitForEvent("download");
  await files.getByRole("link", { name: "RQ-2026-001-corner-basket.png" }).click();
  expect(sha256(readFileSync(await (await photo).path()))).toBe(hashes["RQ-2026-001"][1]);
  await page.goBack();

  const pdfDownload = page.waitForEvent("download");
  await page.getByRole("link", { name: "Audit pack (PDF) for CR-2026-001" }).click();
  const pdf = await pdfDownload;
  expect(pdf.suggestedFilename()).toBe("audit-pack-CR-2026-001.pdf");
  const pdfPath = testInfo.outputPath("audit-pack-CR-2026-001.pdf");
  await pdf.saveAs(pdfPath);
  const text = execFileSync("pdftotext", ["-layout", pdfPath, "-"], { encoding: "utf8" }).replace(
    /\s+/g,
    " ",
  );
  // The change's signatures as "printed name, meaning", each run's as "meaning by printed name".
  for (const line of [
    `${DEMO.engineer.name} Authored`,
    `${DEMO.approver.name} Approved`,
    `${DEMO.reviewer.name} Verified`,
  ])
    expect(text).toContain(line);
  expect(
    text.match(new RegExp(`Performed by ${DEMO.technician.name}, 2026-06-08 15:00:00 UTC`, "g")),
  ).toHaveLength(2);
  expect(
    text.match(new RegExp(`Verified by ${DEMO.engineer.name}, 2026-06-10 09:00:00 UTC`, "g")),
  ).toHaveLength(2);
  for (const h of Object.values(hashes).flat()) expect(text).toContain(h);

  const zipDownload = page.waitForEvent("download");
  await page.getByRole("link", { name: "Audit pack with evidence files (ZIP)" }).click();
  const zip = await zipDownload;
  expect(zip.suggestedFilename()).toBe("audit-pack-CR-2026-001.zip");
  const entries = unzipSync(new Uint8Array(readFileSync(await zip.path())));
  const sums = strFromU8(entries.SHA256SUMS)
    .trim()
    .split("\n")
    .map((line) => line.split("  "));
  for (const [hash, path] of sums) expect(sha256(entries[path])).toBe(hash);
  expect(
    sums
      .filter(([, path]) => path.startsWith("evidence/"))
      .map(([hash]) => hash)
      .sort(),
  ).toEqual(Object.values(hashes).flat().sort());
});

test("an auditor sees no write controls, and the API refuses a write with the auditor's read-and-write token", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  await page.goto("/evidence");
  await expect(page.getByRole("heading", { level: 1, name: "Evidence" })).toBeVisible();
  await expect(page.getByRole("link", { name: "New test run" })).toHaveCount(0);

  await page.goto("/systems");
  await page.getByRole("link", { name: "R-AW3-PH" }).first().click();
  await expect(page.getByRole("heading", { name: /Effective version \d+/ })).toBeVisible();
  await expect(page.getByLabel("What should change")).toHaveCount(0);
  await expect(page.getByRole("button", { name: /Open change request/ })).toHaveCount(0);

  // The open change of the demo, waiting for evidence: readable, but nothing to press.
  await page.goto("/changes");
  await page.getByRole("link", { name: "CR-2026-002" }).click();
  await expect(page.getByRole("heading", { name: "Requalification gate: not met" })).toBeVisible();
  await expect(page.getByRole("region", { name: "Next step" }).getByRole("button")).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Link" })).toHaveCount(0);
  await expect(page.getByRole("main").getByRole("button")).toHaveCount(0);

  await page.goto("/evidence");
  const runs = page.getByRole("table", { name: /Test runs/ });
  await runs
    .getByRole("link", { name: /^TR-\d{4}/ })
    .first()
    .click();
  await expect(page).toHaveURL(/\/evidence\/runs\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("heading", { level: 1 })).toContainText(/^TR-\d{4}/);
  await expect(page.getByRole("button", { name: "Add sample" })).toHaveCount(0);
  await expect(page.getByRole("form", { name: "Upload evidence file" })).toHaveCount(0);
  const runId = page.url().split("/").at(-1)!;

  const token = await createToken(page, "auditor", "Auditor's script", "Read and write");
  const headers = { Authorization: `Bearer ${token}` };
  const read = await page.request.get(`/api/v1/test-runs/${runId}`, { headers });
  expect(read.status()).toBe(200);
  const samplesBefore = (await read.json()).samples;
  const write = await page.request.post(`/api/v1/test-runs/${runId}/samples`, {
    headers,
    data: { sampleLabel: "AUDITOR-1", components: 1, counts: { E: 1 }, largest: {} },
  });
  expect(write.status()).toBe(403);
  expect(write.headers()["content-type"]).toContain("application/json");
  expect(await write.json()).toEqual({ error: "Your role does not allow this." });
  expect(
    (await (await page.request.get(`/api/v1/test-runs/${runId}`, { headers })).json()).samples,
  ).toEqual(samplesBefore);
});

test("a token created in Account settings is shown once, reads the API, and is refused once revoked", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  const name = `Lab script ${Date.now()}`;
  const token = await createToken(page, "engineer", name, "Read");

  const ok = await page.request.get("/api/v1/cleaning-systems", {
    headers: { Authorization: `Bearer ${token}` },
  });
  expect(ok.status()).toBe(200);
  expect(JSON.stringify(await ok.json())).toContain("SC-1");

  // Shown once: after a reload only its first characters are listed.
  await page.reload();
  await expect(page.getByTestId("new-api-token")).toHaveCount(0);
  const row = page
    .getByRole("table", { name: "Your API tokens" })
    .getByRole("row", { name: new RegExp(name) });
  await expect(row).toContainText(`${token.slice(0, 12)}…`);
  await expect(row).not.toContainText(token);
  await expect(row).not.toContainText("Never");
  await row.getByRole("button", { name: `Revoke token ${name}` }).click();
  await expect(row).toContainText("Revoked");

  const refused = await page.request.get("/api/v1/cleaning-systems", {
    headers: { Authorization: `Bearer ${token}` },
  });
  expect(refused.status()).toBe(401);
  expect(refused.headers()["content-type"]).toContain("application/json");
  expect((await refused.json()).error).toMatch(
    /^This API token was revoked on \d{4}-\d{2}-\d{2}\. Create a new one\.$/,
  );
});

test("a trace shows the newest entries first and opens older ones from its link, each still showing the value before it", async ({
  page,
}) => {
  await signInAs(page, "auditor");
  await page.getByRole("navigation").getByRole("link", { name: "Trace" }).click();
  // The recipe chooser waits for a system: a plant's recipes are read for the chosen one.
  await expect(page.getByLabel("Recipe")).toBeDisabled();
  await page
    .getByLabel("Cleaning system")
    .selectOption({ label: "SC-1 · Single-chamber spray washer" });
  await page.getByLabel("Recipe").selectOption({ label: "R-SC1-SF · Fitting, spray" });
  // The list narrows to the chosen recipe once the choice has gone through: wait for its own row.
  await page
    .getByRole("list", { name: "Matching parameters" })
    .getByRole("link", { name: /Drying temperature drying\.temperature.*R-SC1-SF/ })
    .click();
  await expect(page).toHaveURL(/key=drying\.temperature/);
  // One entry a page, so the demo's two versions need the link [db/seed-changes.ts: 90 °C → 105 °C].
  await page.goto(`${page.url()}&entries=1`);
  const newest = page.getByRole("article", { name: "Version 2: 105 °C" });
  await expect(newest).toContainText("90 °C → 105 °C");
  await expect(page.getByRole("article", { name: "Version 1: 90 °C" })).toHaveCount(0);
  await expect(page.getByText("1 of 2 entries shown.")).toBeVisible();
  await page.getByRole("link", { name: "Show 1 older entry" }).click();
  await expect(page.getByRole("article", { name: "Version 1: 90 °C" })).toBeVisible();
  await expect(page.getByRole("link", { name: /Show \d+ older/ })).toHaveCount(0);
});
