import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { NextRequest } from "next/server";
import { auditEvents, partFamilies, partFamilyPictures } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { GET, POST } from "@/app/api/parts/families/[familyId]/picture/route";
import { PICTURE_MAX_BYTES, pictureProblem, sniffPicture } from "@/lib/parts/picture";
import { localStore, setStore } from "@/lib/storage";
import { actAs, peopleByRole } from "./support/endpoints";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));

// The first bytes of each format (PNG: ISO/IEC 15948:2004 §5.2; JPEG SOI + APP0: ITU-T T.81 Annex B).
const PNG = new Uint8Array([
  0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 73, 72, 68, 82,
]);
const JPEG = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46, 0x49, 0x46, 0]);
const TEXT = new TextEncoder().encode("<svg xmlns='http://www.w3.org/2000/svg'/>");

describe("which pictures are taken", () => {
  it("knows PNG and JPEG by their first bytes, whatever the file is called", () => {
    expect(sniffPicture(PNG)).toBe("image/png");
    expect(sniffPicture(JPEG)).toBe("image/jpeg");
    expect(sniffPicture(TEXT)).toBeNull();
    expect(sniffPicture(PNG.slice(0, 7))).toBeNull();
  });
  it("refuses an empty file, a file over the limit and anything else", () => {
    expect(pictureProblem(new Uint8Array())).toBe("The file is empty.");
    const big = new Uint8Array(PICTURE_MAX_BYTES + 1);
    big.set(PNG);
    expect(pictureProblem(big)).toMatch(/larger than 5 MB/);
    expect(pictureProblem(TEXT)).toBe("The file is not a PNG or JPEG image.");
    expect(pictureProblem(JPEG)).toBeNull();
  });
});

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let people: Awaited<ReturnType<typeof peopleByRole>>;
let familyId: string;
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
  setStore(localStore(mkdtempSync(join(tmpdir(), "washproof-picture-store-"))));
  familyId = (await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210")))[0]
    .id;
});
afterAll(() => t.cleanup());

const url = () => `http://127.0.0.1/api/parts/families/${familyId}/picture`;
const ctx = () => ({ params: Promise.resolve({ familyId }) });
const upload = (bytes: Uint8Array, name: string) => {
  const body = new FormData();
  body.set("file", new File([bytes as BlobPart], name));
  return POST(new NextRequest(url(), { method: "POST", body }), ctx());
};
const events = async () =>
  (await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, familyId))).filter(
    (e) => e.action === "part_family.picture_set",
  );

describe("a part family's picture", () => {
  it("refuses an auditor and a file that is not an image (whatever its name), writing nothing", async () => {
    await actAs(people.auditor);
    expect((await upload(PNG, "vb.png")).status).toBe(403);
    await actAs(people.engineer);
    const refused = await upload(TEXT, "vb.png");
    expect(refused.status).toBe(422);
    expect(await refused.json()).toMatchObject({ error: "The file is not a PNG or JPEG image." });
    expect(await t.db.select().from(partFamilyPictures)).toEqual([]);
    expect(await events()).toEqual([]);
    expect((await GET(new NextRequest(url()), ctx())).status).toBe(404);
  });

  it("stores a PNG, shows it to any role, and a replacement keeps the old one in the audit trail", async () => {
    await actAs(people.engineer);
    expect(await (await upload(PNG, "vb.png")).json()).toEqual({
      ok: true,
      message: "Picture saved.",
    });
    await actAs(people.technician);
    const shown = await GET(new NextRequest(url()), ctx());
    expect(shown.headers.get("content-type")).toBe("image/png");
    expect(new Uint8Array(await shown.arrayBuffer())).toEqual(PNG);

    await actAs(people.admin);
    await upload(JPEG, "vb-new.jpg");
    const [first, second] = await events();
    expect(JSON.parse(first.newValue!)).toMatchObject({ mimeType: "image/png", name: "vb.png" });
    expect(JSON.parse(second.oldValue!)).toMatchObject({
      sha256: JSON.parse(first.newValue!).sha256,
    });
    expect((await GET(new NextRequest(url()), ctx())).headers.get("content-type")).toBe(
      "image/jpeg",
    );
  });
});
