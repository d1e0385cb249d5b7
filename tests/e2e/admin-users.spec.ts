import { expect, signIn, signInAs, test } from "./fixtures";

test("bad input shows each error beside its field and keeps what was typed", async ({ page }) => {
  await signInAs(page, "admin");
  await page.goto("/admin/users/new");
  await page.getByLabel("Full name").fill("Q");
  await page.getByLabel("E-mail").fill("not-an-email");
  await page.getByLabel("Job title (optional)").fill("Night-shift lead");
  await page.getByRole("button", { name: "Create user" }).click();
  await expect(page.getByText("Enter the person's full name.")).toBeVisible();
  await expect(page.getByText("Enter a valid e-mail address.")).toBeVisible();
  await expect(page.getByText("Choose at least one role.")).toBeVisible();
  await expect(page.getByLabel("Full name")).toHaveValue("Q");
  await expect(page.getByLabel("E-mail")).toHaveValue("not-an-email");
  await expect(page.getByLabel("Job title (optional)")).toHaveValue("Night-shift lead");
});

test("an admin creates a user who must choose a password at first sign-in", async ({
  page,
  browser,
}) => {
  await signInAs(page, "admin");
  await page.goto("/admin/users/new");
  await page.getByLabel("Full name").fill("Oskar Lindqvist");
  await page.getByLabel("E-mail").fill("oskar.lindqvist@fennmoor.example");
  await page.getByRole("checkbox", { name: /Technician/ }).check();
  await page.getByRole("button", { name: "Create user" }).click();
  const temporary = await page.getByTestId("temporary-password").textContent();
  expect(temporary).toMatch(/^\S{4}-\S{4}-\S{4}-\S{4}$/);

  const other = await browser.newPage();
  await signIn(other, "oskar.lindqvist@fennmoor.example", temporary!);
  await expect(other).toHaveURL(/\/account\/password$/);
  await expect(other.getByRole("navigation", { name: "Main" })).toHaveCount(0);
  // Any other page sends them back until they have chosen a password.
  await other.goto("/systems");
  await expect(other).toHaveURL(/\/account\/password$/);

  await other.getByLabel("Current password").fill(temporary!);
  await other.getByLabel("New password", { exact: true }).fill("short");
  await other.getByLabel("New password again").fill("short");
  await other.getByRole("button", { name: "Change password" }).click();
  await expect(other.getByText("Use at least 12 characters.")).toBeVisible();
  // An error on another field keeps the current password where it was typed.
  await expect(other.getByLabel("Current password")).toHaveValue(temporary!);

  // A wrong current password is emptied from its box; the new password stays.
  await other.getByLabel("Current password").fill("not the temporary one");
  await other.getByLabel("New password", { exact: true }).fill("basket rinse conductivity");
  await other.getByLabel("New password again").fill("basket rinse conductivity");
  await other.getByRole("button", { name: "Change password" }).click();
  await expect(other.getByText("The current password is not correct.")).toBeVisible();
  await expect(other.getByLabel("Current password")).toHaveValue("");
  await expect(other.getByLabel("New password", { exact: true })).toHaveValue(
    "basket rinse conductivity",
  );

  await other.getByLabel("Current password").fill(temporary!);
  await other.getByLabel("New password", { exact: true }).fill("basket rinse conductivity");
  await other.getByLabel("New password again").fill("basket rinse conductivity");
  await other.getByRole("button", { name: "Change password" }).click();
  await expect(other).toHaveURL(/\/queue/);
  await expect(
    other.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Evidence" }),
  ).toBeVisible();
  await other.close();
});

test("an admin sends a test e-mail and reads it in the demo mailbox", async ({ page }) => {
  const to = `check-${Date.now()}@fennmoor.example`;
  await signInAs(page, "admin");
  await page.goto("/admin/email");
  await page.getByLabel("To").fill(to);
  await page.getByRole("button", { name: "Send" }).click();
  await expect(page.getByText(`Queued a test message to ${to}.`)).toBeVisible();
  // Delivery happens after the response; the page shows it once it has arrived and been marked sent.
  await expect(async () => {
    await page.reload();
    await expect(
      page.getByRole("region", { name: "Demo mailbox" }).getByText(`to ${to}`),
    ).toBeVisible({ timeout: 1000 });
    await expect(
      page.getByRole("row", { name: new RegExp(to) }).getByRole("cell", { name: "Sent" }),
    ).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 20_000 });
});

test("Create user clears the form once the user exists, and Reactivate does not carry the deactivation's reason", async ({
  page,
}) => {
  // A person of our own, never a demo user other tests sign in as.
  const name = `Nora Quist ${Date.now()}`;
  const email = `nora.quist-${Date.now()}@fennmoor.example`;
  await signInAs(page, "admin");
  await page.goto("/admin/users/new");
  await page.getByLabel("Full name").fill(name);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Job title (optional)").fill("Lab technician");
  await page.getByRole("checkbox", { name: /Technician/ }).check();
  await page.getByRole("button", { name: "Create user" }).click();
  await expect(page.getByText(`${name} can now sign in.`)).toBeVisible();
  // A second click must not be able to submit the same person again.
  await expect(page.getByLabel("Full name")).toHaveValue("");
  await expect(page.getByLabel("E-mail")).toHaveValue("");
  await expect(page.getByLabel("Job title (optional)")).toHaveValue("");
  await expect(page.getByRole("checkbox", { name: /Technician/ })).not.toBeChecked();
  await expect(page.getByTestId("temporary-password")).toBeVisible();

  await page.goto("/admin");
  await page.getByRole("link", { name }).click();
  const deactivate = page.getByRole("form", { name: "Deactivate user" });
  await deactivate.getByLabel("Reason").fill("Left the company at the end of the contract");
  await deactivate.getByRole("button", { name: "Deactivate" }).click();
  const reactivate = page.getByRole("form", { name: "Reactivate user" });
  await expect(reactivate.getByRole("button", { name: "Reactivate" })).toBeVisible();
  await expect(reactivate.getByLabel("Reason")).toHaveValue("");
});
