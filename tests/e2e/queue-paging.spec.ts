import { expect, signInAs, test } from "./fixtures";

test("an address past a kind's last page, or naming a kind with nothing waiting, opens what exists", async ({
  page,
}) => {
  await signInAs(page, "engineer");
  const queue = await (await page.request.get("/api/queue")).json();
  const kind: string = queue.kinds[0].kind;
  await page.goto(`/queue?${new URLSearchParams({ kind, page: "999" })}`);
  await expect(page).toHaveURL(`/queue?${new URLSearchParams({ kind, page: "1" })}`);
  await expect(page.getByText(`${kind}: page 1 of 1`)).toBeVisible();
  // The list says above it that it holds one kind only.
  await expect(page.getByText(`Showing ${kind.toLowerCase()} only`)).toBeVisible();
  await page.goto("/queue?kind=Nothing+of+this+kind&page=2");
  await expect(page).toHaveURL("/queue");
  await expect(page.getByRole("heading", { name: "My queue" })).toBeVisible();
});
