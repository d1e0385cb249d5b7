import { expect, signInAs, test } from "./fixtures";
import type { Page } from "@playwright/test";

// Invented master data; a suffix keeps the codes unique when the suite is retried on the same database.
const run = Date.now().toString(36).slice(-5).toUpperCase();
const SPEC = `CS-RB-${run}`;
const FAMILY_A = `PF-RB1-${run}`;
const FAMILY_B = `PF-RB2-${run}`;
const FAMILY_HAND = `PF-EC-${run}`;

const SPECS_CSV =
  "code,name,customer,document_number,revision,ccc,max_metallic_um,gravimetric_limit_mg,gravimetric_basis,customer_approves_changes\n" +
  `${SPEC},Rail block bonding grade,Ostwick Fluid Power,OFP-CL-3${run},A,A(B-E17/F-G14/H-I4/J-N00),500,2.5,per_component,yes\n`;

// The families file uses the plant's own headers for two columns; the engineer maps them.
const FAMILIES_CSV =
  "code,name,Teilenummern,material,Flaeche,wetted_area_method,spec_code\n" +
  `${FAMILY_A},Rail block RB-1,RB1-${run}-01;RB1-${run}-02,Aluminium 6082-T6,310,cad_model,${SPEC}\n` +
  `${FAMILY_B},Rail block RB-2,RB2-${run}-01,Aluminium 6082-T6,295.5,measured,${SPEC}\n`;

async function importFile(
  page: Page,
  kind: "Part families" | "Specifications",
  text: string,
  mapping: Record<string, string> = {},
) {
  await page.getByRole("radio", { name: kind }).check();
  const importer = page.getByRole("form", { name: `Import ${kind.toLowerCase()} from CSV` });
  await importer
    .getByLabel(`CSV file of ${kind.toLowerCase()}`)
    .setInputFiles({ name: `${kind}.csv`, mimeType: "text/csv", buffer: Buffer.from(text) });
  if (Object.keys(mapping).length) {
    await expect(importer.getByRole("group", { name: "Match the file's columns" })).toBeVisible();
    for (const [field, column] of Object.entries(mapping))
      await importer.getByLabel(field).selectOption(column);
  }
  await importer.getByRole("button", { name: "Import" }).click();
  return importer;
}

test("an engineer onboards part families and a specification, refuses a malformed code and qualifies a combination", async ({
  page,
}) => {
  await signInAs(page, "engineer");

  // Bulk onboarding: the specification first, then the two families that cite it.
  await page.goto("/parts/import");
  const specs = await importFile(page, "Specifications", SPECS_CSV);
  await expect(specs.getByRole("status")).toHaveText("1 specification imported.");
  const families = await importFile(page, "Part families", FAMILIES_CSV, {
    "Part numbers (separated by ; or ,)": "Teilenummern",
    "Wetted area (cm²)": "Flaeche",
  });
  await expect(families.getByRole("status")).toHaveText("2 part families imported.");

  // The same file again clashes with the register: nothing is saved, each line named.
  const again = await importFile(page, "Part families", FAMILIES_CSV, {
    "Part numbers (separated by ; or ,)": "Teilenummern",
    "Wetted area (cm²)": "Flaeche",
  });
  await expect(again.getByRole("alert")).toContainText("Nothing was imported.");
  await expect(again.getByRole("alert")).toContainText(`Line 2: The code ${FAMILY_A} is already`);

  await page.goto("/parts");
  const list = page.getByRole("table", { name: "Part families" });
  await expect(list.getByRole("row", { name: new RegExp(FAMILY_A) })).toContainText(
    `${SPEC} rev A`,
  );
  await expect(list.getByRole("row", { name: new RegExp(FAMILY_B) })).toContainText("295.5 cm²");

  // A family by hand.
  await page.getByRole("link", { name: "New part family" }).click();
  const form = page.getByRole("form", { name: "New part family" });
  await form.getByLabel("Family code").fill(FAMILY_HAND);
  await form.getByLabel("Name").fill("End cap EC-7");
  await form.getByLabel("Part numbers").fill(`EC7-${run}-01, EC7-${run}-02`);
  await form.getByLabel("Customer (optional)").fill("Ostwick Fluid Power");
  await form.getByLabel("Material").fill("Brass CW614N");
  await form.getByLabel("Drawing number (optional)").fill("D-EC-7");
  await form.getByLabel("Drawing revision (optional)").fill("B");
  await form.getByLabel("Wetted area per part (cm²)").fill("0");
  await form.getByLabel("How the area was determined").selectOption({ label: "Measured" });
  await form
    .getByLabel("Specification in force")
    .selectOption({ label: `${SPEC} rev A · Rail block bonding grade` });
  await form.getByRole("button", { name: "Create part family" }).click();
  // A zero area is refused beside its field, and what was typed stays.
  await expect(form.getByText("Wetted area must be greater than 0 cm².")).toBeVisible();
  await expect(form.getByLabel("Family code")).toHaveValue(FAMILY_HAND);
  await form.getByLabel("Wetted area per part (cm²)").fill("64");
  await form.getByRole("button", { name: "Create part family" }).click();
  await expect(page).toHaveURL(/\/parts$/);
  await expect(
    page
      .getByRole("table", { name: "Part families" })
      .getByRole("row", { name: new RegExp(FAMILY_HAND) }),
  ).toContainText("64 cm²");

  // A malformed cleanliness code: the live preview names the position, and so does the server.
  await page.goto("/parts/specs/new");
  const spec = page.getByRole("form", { name: "New specification" });
  const ccc = spec.getByLabel("Cleanliness code specification");
  await ccc.fill("A(B-E17/F-G14)");
  const preview = spec.getByRole("region", { name: "Parsed specification" });
  await expect(
    preview.getByRole("table", { name: "Parsed size classes and limits" }),
  ).toContainText("100–200 µm");
  await ccc.fill("A(B-E17/Z12)");
  await expect(preview).toContainText('"Z" in "Z12" is not a size class');
  await expect(preview).toContainText("(at character 9)");
  await spec.getByLabel("Register code").fill(`CS-BAD-${run}`);
  await spec.getByLabel("Title").fill("Malformed on purpose");
  await spec.getByLabel("Customer", { exact: true }).fill("Ostwick Fluid Power");
  await spec.getByLabel("Customer document number").fill("OFP-CL-999");
  await spec.getByLabel("Revision", { exact: true }).fill("A");
  await spec.getByRole("button", { name: "Register specification" }).click();
  await expect(spec.getByRole("alert")).toContainText("Nothing was saved.");
  await expect(spec.getByText(/at character 9/).first()).toBeVisible();
  await page.goto(`/parts/specs?status=all&q=CS-BAD-${run}`);
  await expect(page.getByRole("table", { name: "Specifications" })).toContainText(
    "No specification matches.",
  );

  // Qualify the hand-made family on a recipe version in use.
  await page.goto("/parts/combinations");
  const qualify = page.getByRole("form", { name: "Qualify a combination" });
  await qualify.getByLabel("Recipe version").selectOption({ index: 1 });
  await qualify.getByLabel("Part family").selectOption({ label: `${FAMILY_HAND} · End cap EC-7` });
  await qualify
    .getByLabel("Basis of the qualification")
    .fill(`Customer PPAP report OFP-PPAP-${run}, 2026`);
  await qualify.getByLabel("Requalification interval (months)").fill("12");
  await qualify.getByRole("button", { name: "Qualify combination" }).click();
  await expect(qualify.getByRole("status")).toHaveText("Combination qualified.");
  await expect(
    page
      .getByRole("table", { name: "Qualified combinations" })
      .getByRole("row", { name: new RegExp(FAMILY_HAND) }),
  ).toContainText(`OFP-PPAP-${run}`);
});
