import { expect, signInAs, test } from "./fixtures";

// The demo's emergency change (db/seed-change-types.ts) went into force six days ago with
// approval due three days later; nobody approved it.
const TITLE = "Lengthen the final rinse after water stains";

test("an emergency change past its approval deadline is escalated and shows Emergency", async ({
  page,
}) => {
  await signInAs(page, "admin");
  await page.goto("/queue");
  const queue = page.getByRole("table", { name: "Waiting for you" });
  const item = queue.getByRole("row").filter({ hasText: TITLE });
  await expect(item).toContainText("Emergency approval overdue");
  await expect(item).toContainText("Overdue since");
  await item
    .getByRole("link", { name: new RegExp(`^Emergency · CR-\\d{4}-\\d{3} ${TITLE}$`) })
    .click();

  await expect(page.getByRole("heading", { level: 1 })).toContainText(TITLE);
  await expect(page.getByText("Emergency", { exact: true }).first()).toBeVisible();
  await expect(
    page.getByRole("heading", { name: "Emergency change: approval overdue" }),
  ).toBeVisible();

  await page.goto("/changes");
  await expect(page.getByRole("row").filter({ hasText: TITLE })).toContainText("Emergency");

  // The escalation pass runs a few seconds after the server starts; its e-mail then reaches
  // the demo mailbox.
  await expect(async () => {
    await page.goto("/admin/email");
    await expect(
      page
        .getByRole("region", { name: "Demo mailbox" })
        .getByText(`approval overdue: ${TITLE}`)
        .first(),
    ).toBeVisible({ timeout: 2_000 });
  }).toPass({ timeout: 60_000 });
});
