import { expect, signInAs, test } from "./fixtures";

// Invented master data; the suffix keeps the codes unique when the suite runs again on the same database.
const run = Date.now().toString(36).slice(-5).toUpperCase();
const SPEC = `CS-TS-${run}`;
const FAMILY = `PF-TS-${run}`;

test("a revision that tightens a specification offers a change request on each recipe qualified to it", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  await page.goto("/parts/import");
  await page.getByRole("radio", { name: "Specifications" }).check();
  const specs = page.getByRole("form", { name: "Import specifications from CSV" });
  await specs.getByLabel("CSV file of specifications").setInputFiles({
    name: "spec.csv",
    mimeType: "text/csv",
    buffer: Buffer.from(
      "code,name,customer,document_number,revision,ccc\n" +
        `${SPEC},Tie rod,Ostwick Fluid Power,OFP-TR-${run},A,A(B-E17/F-G14/H-I4/J-N00)\n`,
    ),
  });
  await specs.getByRole("button", { name: "Import" }).click();
  await expect(specs.getByRole("status")).toHaveText("1 specification imported.");
  await page.getByRole("radio", { name: "Part families" }).check();
  const families = page.getByRole("form", { name: "Import part families from CSV" });
  await families.getByLabel("CSV file of part families").setInputFiles({
    name: "family.csv",
    mimeType: "text/csv",
    buffer: Buffer.from(
      "code,name,part_numbers,material,wetted_area_cm2,spec_code\n" +
        `${FAMILY},Tie rod TR-1,TR1-${run},Steel 42CrMo4,180,${SPEC}\n`,
    ),
  });
  await families.getByRole("button", { name: "Import" }).click();
  await expect(families.getByRole("status")).toHaveText("1 part family imported.");

  // Qualified on the pump-housing recipe's effective version, which the demo already has a change open on.
  await page.goto("/parts/combinations");
  const qualify = page.getByRole("form", { name: "Qualify a combination" });
  const version = qualify.getByLabel("Recipe version");
  const effective = await version
    .locator("option", { hasText: /^R-AW3-PH v\d+ \(effective\)/ })
    .getAttribute("value");
  await version.selectOption(effective!);
  await qualify.getByLabel("Part family").selectOption({ label: `${FAMILY} · Tie rod TR-1` });
  await qualify.getByLabel("Basis of the qualification").fill(`Customer PPAP OFP-TR-${run}`);
  await qualify.getByLabel("Requalification interval (months)").fill("12");
  await qualify.getByRole("button", { name: "Qualify combination" }).click();
  await expect(qualify.getByRole("status")).toHaveText("Combination qualified.");

  await page.goto(`/parts/specs?status=all&q=${SPEC}`);
  await page.getByRole("link", { name: SPEC }).click();
  const revise = page.getByRole("form", { name: "New revision" });
  await revise.getByLabel("New revision").fill("B");
  await revise.getByLabel("Cleanliness code specification").fill("A(B-E16/F-G14/H-I4/J-N00)");
  await revise
    .getByLabel("Reason for the revision")
    .fill("Customer lowered the small-particle limit.");
  await revise.getByRole("button", { name: "Save revision" }).click();
  // The page re-reads: revision A is superseded, and B is listed as the one in force.
  const revisionB = page.getByRole("table", { name: "Revisions" }).getByRole("link", { name: "B" });
  await expect(revisionB).toBeVisible();
  await revisionB.click();
  const control = page.getByRole("region", { name: "Change control for this revision" });
  await expect(control).toContainText("This revision tightens a limit");
  const offer = control.getByRole("table", { name: "Recipes qualified to this revision" });
  await expect(offer.getByRole("row", { name: /R-AW3-PH/ })).toBeVisible();
  // One open change per recipe: the demo's pump-housing change must finish first, and says so.
  await offer.getByRole("button", { name: "Open change request on R-AW3-PH" }).click();
  await expect(control.getByRole("alert")).toContainText(
    "is already open on this recipe: finish or withdraw it first.",
  );
});
