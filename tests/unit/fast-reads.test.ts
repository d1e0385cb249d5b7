import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { createClient, type Client, type ResultSet } from "@libsql/client";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { withFastReads } from "@/db/fast-reads";

// The reference is @libsql/client itself on the same file: every read through the kept
// statements must answer exactly as the client answers, or be left to the client.
let dir: string;
let plain: Client;
let fast: Client;
/** Statements that reached the client under the fast path. */
let reachedClient = 0;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), "washproof-fast-reads-"));
  const path = join(dir, "reads.db");
  plain = createClient({ url: `file:${path}` });
  await plain.execute("PRAGMA journal_mode = WAL");
  await plain.executeMultiple(`
    create table parts (id integer primary key, code text not null, mass_g real, note text, data blob, big integer);
    create table lots (id integer primary key, part_id integer references parts(id), code text);
    insert into parts values (1, 'PF-1', 12.5, null, x'00ff10', 42), (2, 'PF-2', 0.25, 'two', null, 9007199254740991);
    insert into lots values (10, 1, 'L-10'), (11, 2, 'L-11');
  `);
  const inner = createClient({ url: `file:${path}` });
  const execute = inner.execute.bind(inner);
  inner.execute = ((...args: Parameters<Client["execute"]>) => {
    reachedClient += 1;
    return execute(...args);
  }) as Client["execute"];
  fast = withFastReads(inner, path, 5000);
});

afterAll(() => {
  fast.close();
  plain.close();
  rmSync(dir, { recursive: true, force: true });
});

/** What a reader of a result can observe: names, indexes, length, JSON and the column lists. */
function observed(result: ResultSet) {
  return {
    columns: result.columns,
    columnTypes: result.columnTypes,
    rows: result.rows.map((row) => ({
      keys: Object.keys(row),
      byName: { ...row },
      byIndex: Array.prototype.slice.call(row),
      length: row.length,
      json: JSON.stringify(row),
    })),
    json: JSON.stringify(result),
  };
}

describe("plain reads on kept statements", () => {
  const reads: [string, { sql: string; args?: (string | number | boolean | null | Date)[] }][] = [
    ["every kind of value", { sql: "select * from parts order by id" }],
    [
      "a repeated column name keeps the first by name, both by index",
      {
        sql: "select p.id, l.id, l.code from parts p join lots l on l.part_id = p.id order by l.id",
      },
    ],
    [
      "positional arguments",
      { sql: "select code from parts where id = ? or code = ?", args: [1, "PF-2"] },
    ],
    [
      "a boolean argument",
      { sql: "select count(*) as n from parts where (id = 1) = ?", args: [true] },
    ],
    ["a date argument", { sql: "select ? as at", args: [new Date(Date.UTC(2026, 11, 3))] }],
    ["no rows", { sql: "select id from parts where id = ?", args: [99] }],
    ["a null argument", { sql: "select ? is null as blank", args: [null] }],
  ];
  for (const [name, statement] of reads)
    it(`answers as the client does: ${name}`, async () => {
      const expected = observed(await plain.execute(statement));
      // Twice: the first prepares, the second runs the kept statement.
      expect(observed(await fast.execute(statement))).toEqual(expected);
      expect(observed(await fast.execute(statement))).toEqual(expected);
    });

  it("answers a plain read itself, and leaves a write to the client", async () => {
    reachedClient = 0;
    await fast.execute({ sql: "select code from parts where id = ?", args: [2] });
    await fast.execute("  SELECT count(*) from lots");
    expect(reachedClient).toBe(0);
    await fast.execute("update parts set note = note where id = 1");
    expect(reachedClient).toBe(1);
  });

  it("gives back a blob as the client does (an ArrayBuffer of exactly its bytes)", async () => {
    const { rows } = await fast.execute("select data from parts where id = 1");
    expect(rows[0].data).toBeInstanceOf(ArrayBuffer);
    expect([...new Uint8Array(rows[0].data as ArrayBuffer)]).toEqual([0x00, 0xff, 0x10]);
  });

  it("sees a write committed on the client's connection, and holds no read open after it", async () => {
    const count = "select count(*) as n from lots";
    expect((await fast.execute(count)).rows[0].n).toBe(2);
    await fast.execute({ sql: "insert into lots values (?, ?, ?)", args: [12, 1, "L-12"] });
    expect((await fast.execute(count)).rows[0].n).toBe(3);
    await plain.execute("delete from lots where id = 12");
    expect((await fast.execute(count)).rows[0].n).toBe(2);
    // A kept statement left mid-read would keep the log from being folded back into the file.
    const [checkpoint] = (await plain.execute("PRAGMA wal_checkpoint(TRUNCATE)")).rows;
    expect(checkpoint.busy).toBe(0);
  });

  it("leaves writes to the client, which reports rows changed and the new row id", async () => {
    const result = await fast.execute({
      sql: "insert into lots values (?, ?, ?)",
      args: [13, 2, "L-13"],
    });
    expect(result.rowsAffected).toBe(1);
    expect(result.lastInsertRowid).toBe(13n);
    await fast.execute("delete from lots where id = 13");
  });

  it("leaves to the client, and so to its own errors, what it cannot answer the same way", async () => {
    const cases = [
      { sql: "select big + 2 as past from parts where id = 2" }, // past 2^53 in number mode
      { sql: "select nothing from parts" }, // no such column
      { sql: "select ? as x", args: [undefined as unknown as null] }, // undefined is refused
      { sql: "select ? as x", args: [Number.NaN] }, // so is a number that is not finite
    ];
    for (const statement of cases) {
      const expected = await plain.execute(statement).then(
        () => "answered",
        (error: Error) => `${error.name}: ${error.message}`,
      );
      expect(expected).not.toBe("answered");
      const actual = await fast.execute(statement).then(
        () => "answered",
        (error: Error) => `${error.name}: ${error.message}`,
      );
      expect(actual).toBe(expected);
    }
  });

  it("answers named arguments through the client", async () => {
    const statement = { sql: "select code from parts where id = :id", args: { id: 2 } };
    expect(observed(await fast.execute(statement))).toEqual(
      observed(await plain.execute(statement)),
    );
  });

  it("keeps a bounded number of statements and still answers after letting the oldest go", async () => {
    for (let i = 0; i < 700; i++) {
      const { rows } = await fast.execute(`select ${i} as n`);
      expect(rows[0].n).toBe(i);
    }
    expect((await fast.execute("select 0 as n")).rows[0].n).toBe(0);
  });
});
