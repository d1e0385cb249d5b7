import { expect, signInAs, test } from "./fixtures";

// A 1 × 1 PNG (ISO/IEC 15948 signature, IHDR, IDAT, IEND): the smallest real picture.
const PNG = Buffer.from(
  "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==",
  "base64",
);

test("an engineer gives a part family a picture; a file that is not an image is refused whatever its name; an auditor sees the picture but cannot change it", async ({
  page,
  browser,
}) => {
  await signInAs(page, "engineer");
  await page.goto("/parts");
  await page
    .getByRole("table", { name: "Part families" })
    .getByRole("link", { name: "PF-SF-12" })
    .click();
  const picture = page.getByRole("region", { name: "Picture" });
  await picture.getByLabel(/^(Upload a|Replace the) picture$/).setInputFiles({
    name: "fitting.png",
    mimeType: "image/png",
    buffer: Buffer.from("<svg xmlns='http://www.w3.org/2000/svg'/>"),
  });
  await expect(picture.getByRole("alert")).toHaveText("The file is not a PNG or JPEG image.");

  await picture.getByLabel(/^(Upload a|Replace the) picture$/).setInputFiles({
    name: "fitting.png",
    mimeType: "image/png",
    buffer: PNG,
  });
  await expect(picture.getByRole("status")).toHaveText("Picture saved.");
  const image = picture.getByRole("img", { name: /^Picture of / });
  await expect(image).toBeVisible();
  const familyUrl = page.url();

  const auditor = await browser.newPage();
  await signInAs(auditor, "auditor");
  await auditor.goto(familyUrl);
  const shown = auditor.getByRole("region", { name: "Picture" });
  await expect(shown.getByRole("img", { name: /^Picture of / })).toBeVisible();
  await expect(shown.getByLabel(/^(Upload a|Replace the) picture$/)).toHaveCount(0);
  await auditor.close();
});
