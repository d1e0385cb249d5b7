import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { seedDemo } from "@/db/seed";
import { users } from "@/db/schema";
import { hasDocuments, listDocuments } from "@/lib/server/documents/queries";
import { LIST_PAGE_SIZE as DOCUMENTS_PAGE_SIZE } from "@/lib/server/list-query";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const LIBRARY = 120;
let engineer: { id: string; name: string };

beforeAll(async () => {
  t = await createTestDatabase();
  expect(await hasDocuments()).toBe(false);
  await seedDemo(t.db);
  [engineer] = await t.db
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(eq(users.email, "engineer@fennmoor.example"));
  // A library: procedures LIB-001… with an effective version 1; every tenth has a draft version 2
  // on top, and LIB-050 carries a literal "50%_" in its title.
  await t.client.execute(`
    insert into documents (id, number, title, type, owner_id, created_at)
    select 'lib-' || n, 'LIB-' || printf('%03d', n),
           case when n = 50 then 'Rinse at 50%_ flow' else 'Library procedure ' || n end,
           'procedure', '${engineer.id}', '2026-01-01T00:00:00.000Z'
    from (with recursive seq(n) as (select 1 union all select n + 1 from seq where n < ${LIBRARY}) select n from seq)`);
  await t.client.execute(`
    insert into document_versions (id, document_id, version, status, content, effective_date, created_by, created_at)
    select 'lib-v1-' || substr(d.id, 5), d.id, 1, 'effective', v.content, '2026-01-02', v.created_by, v.created_at
    from documents d, (select * from document_versions limit 1) v where d.id like 'lib-%'`);
  await t.client.execute(`
    insert into document_versions (id, document_id, version, status, content, created_by, created_at)
    select 'lib-v2-' || substr(d.id, 5), d.id, 2, 'draft', v.content, v.created_by, v.created_at
    from documents d, (select * from document_versions limit 1) v
    where d.id like 'lib-%' and cast(substr(d.id, 5) as integer) % 10 = 0`);
}, 60_000);
afterAll(() => t.cleanup());

describe("the document list at library size", () => {
  it("pages the library by number, fifty at a time, with the count of everything that matches", async () => {
    const first = await listDocuments({ type: "procedure" });
    expect(first.rows).toHaveLength(DOCUMENTS_PAGE_SIZE);
    const numbers = first.rows.map((d) => d.number);
    expect(numbers).toEqual([...numbers].sort());
    const all = [];
    for (let page = 1; page <= first.pages; page++)
      all.push(...(await listDocuments({ type: "procedure", page })).rows);
    expect(all).toHaveLength(first.total);
    expect(new Set(all.map((d) => d.id)).size).toBe(first.total);
    expect(first.total).toBeGreaterThanOrEqual(LIBRARY);
  });

  it("shows each document's latest version and the one in force", async () => {
    const { rows } = await listDocuments({ q: "LIB-010" });
    expect(rows).toHaveLength(1);
    expect(rows[0].latest).toEqual({ version: 2, status: "draft" });
    expect(rows[0].effective).toEqual({ version: 1, effectiveDate: "2026-01-02" });
    const [plain] = (await listDocuments({ q: "LIB-011" })).rows;
    expect(plain.latest).toEqual({ version: 1, status: "effective" });
  });

  it("filters on the latest version's status, not any version's", async () => {
    const drafts = await listDocuments({ status: "draft", q: "LIB" });
    expect(drafts.total).toBe(LIBRARY / 10);
    expect(drafts.rows.every((d) => d.latest.status === "draft")).toBe(true);
    const effective = await listDocuments({ status: "effective", q: "LIB" });
    expect(effective.total).toBe(LIBRARY - LIBRARY / 10);
  });

  it("needs every word of the search in the number, title or owner, in any case, and takes % and _ literally", async () => {
    expect((await listDocuments({ q: "library PROCEDURE 7" })).rows.map((d) => d.number)).toEqual(
      expect.arrayContaining(["LIB-007", "LIB-017", "LIB-070"]),
    );
    expect((await listDocuments({ q: "library procedure 7" })).total).toBe(21);
    expect((await listDocuments({ q: "50%_" })).rows.map((d) => d.number)).toEqual(["LIB-050"]);
    expect((await listDocuments({ q: "5_%" })).total).toBe(0);
    const surname = engineer.name.split(" ").at(-1)!.toUpperCase();
    const owner = await listDocuments({ q: `LIB-001 ${surname}` });
    expect(owner.rows.map((d) => d.number)).toEqual(["LIB-001"]);
  });

  it("answers a page past the end with the last page", async () => {
    const last = await listDocuments({ q: "LIB", page: 999 });
    expect(last.page).toBe(last.pages);
    expect(last.rows.length).toBe(LIBRARY - (last.pages - 1) * DOCUMENTS_PAGE_SIZE);
  });
});
