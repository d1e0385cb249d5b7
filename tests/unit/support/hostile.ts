import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import type { Client } from "@libsql/client";
import fc from "fast-check";
import { formatDate } from "@/lib/format/date";

const ROOT = resolve(__dirname, "../../..");
const read = (file: string) => readFileSync(join(ROOT, file), "utf8");

/**
 * The words an endpoint's inputs are made of, read from its source and the zod schema files it
 * imports: field names (object keys, formData.get names) and literal values (enum words).
 * Generated bodies use them so they get past the first schema often enough to reach the services.
 */
export function vocabulary(file: string): { keys: string[]; words: string[] } {
  const sources = [read(file), read("db/enums.ts")];
  for (const m of read(file).matchAll(/from "@\/lib\/schemas\/([\w-]+)"/g))
    sources.push(read(`lib/schemas/${m[1]}.ts`));
  const text = sources.join("\n");
  const keys = new Set<string>(["payload"]);
  for (const m of text.matchAll(/\.get(?:All)?\("([^"]+)"\)/g)) keys.add(m[1]);
  for (const m of text.matchAll(
    /\b([a-zA-Z]\w{0,30}):\s*(?:z\b|[a-z]\w*\(|\w+Schema\b|checkbox\b)/g,
  ))
    keys.add(m[1]);
  const words = new Set<string>();
  for (const m of text.matchAll(/"([\w.-]{1,40})"/g)) words.add(m[1]);
  return { keys: [...keys].sort(), words: [...words].sort() };
}

/** Up to five ids of every table that has an id column, by table, so some generated inputs name real records. */
export async function realIds(client: Client): Promise<Record<string, string[]>> {
  const tables = await client.execute(
    "SELECT m.name FROM sqlite_master m JOIN pragma_table_info(m.name) p WHERE m.type = 'table' AND p.name = 'id'",
  );
  const out: Record<string, string[]> = {};
  for (const t of tables.rows) {
    const rows = await client.execute(`SELECT id FROM "${String(t.name)}" LIMIT 5`);
    out[String(t.name)] = rows.rows.map((r) => String(r.id));
  }
  return out;
}

/** Ids a field probably wants, by its name: "changeRequestId" takes ids of tables named like change_request. */
function idsFor(key: string, ids: Record<string, string[]>): string[] {
  const m = /^(\w+?)Ids?$/.exec(key.split(".").pop()!);
  if (!m) return [];
  const word = m[1].replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);
  return Object.entries(ids).flatMap(([table, values]) => (table.includes(word) ? values : []));
}

/** Text a person, a script or an attacker might put in any one field. */
export function hostileText(words: string[], ids: Record<string, string[]>): fc.Arbitrary<string> {
  return fc.oneof(
    fc.string({ maxLength: 40 }),
    fc.string({ unit: "grapheme", maxLength: 40 }),
    fc.string({ unit: "binary", maxLength: 20 }),
    fc.oneof(fc.integer(), fc.double(), fc.bigInt()).map(String),
    fc.constantFrom(
      "",
      " ",
      "true",
      "false",
      "on",
      "null",
      "undefined",
      "NaN",
      "-0",
      "1e309",
      "0x10",
      "__proto__",
      "'; DROP TABLE users; --",
      "<script>alert(1)</script>",
    ),
    fc.constantFrom(...words),
    fc.constantFrom(...Object.values(ids).flat()),
    fc.uuid().map(String),
    fc.date({ noInvalidDate: true }).map((d) => formatDate(d)),
    fc.json({ maxDepth: 3 }),
    // Huge: far beyond any field's limit.
    fc
      .tuple(fc.integer({ min: 5, max: 300 }), fc.constantFrom("x", "é", "😀", "\u0000"))
      .map(([k, c]) => c.repeat(k * 1000)),
  );
}

/** Field names: the endpoint's own, nested paths of them, and names it never asked for. */
export function hostileKey(keys: string[]): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: 6, arbitrary: fc.constantFrom(...keys) },
    {
      weight: 2,
      arbitrary: fc
        .array(fc.constantFrom(...keys, "B", "C", "0", "__proto__", "constructor", "prototype"), {
          minLength: 2,
          maxLength: 3,
        })
        .map((p) => p.join(".")),
    },
    { weight: 1, arbitrary: fc.string({ maxLength: 20 }) },
  );
}

/** A JSON value shaped like the endpoint's input: objects whose keys are its field names, any values. */
export function hostileJson(
  keys: string[],
  words: string[],
  ids: Record<string, string[]>,
): fc.Arbitrary<unknown> {
  const { value } = fc.letrec((tie) => ({
    value: fc.oneof(
      { depthSize: "small", withCrossShrink: true },
      fc.jsonValue({ maxDepth: 2 }),
      fc.constantFrom<unknown>(...words, ...Object.values(ids).flat()),
      fc.dictionary(fc.constantFrom(...keys), tie("value"), { maxKeys: 8 }),
      fc.array(tie("value"), { maxLength: 4 }),
    ),
  }));
  return value;
}

/** A value that could be right for this field: a record id of the kind its name says, an enum word, a number, a date, a sentence. */
function plausible(
  key: string,
  words: string[],
  ids: Record<string, string[]>,
): fc.Arbitrary<string> {
  const own = idsFor(key, ids);
  return fc.oneof(
    ...(own.length > 0 ? [{ weight: 6, arbitrary: fc.constantFrom(...own) }] : []),
    { weight: 3, arbitrary: fc.constantFrom(...words) },
    { weight: 2, arbitrary: fc.integer({ min: -5, max: 2000 }).map(String) },
    {
      weight: 1,
      arbitrary: fc
        .date({ min: new Date("2020-01-01"), max: new Date("2030-12-31"), noInvalidDate: true })
        .map((d) => formatDate(d)),
    },
    {
      weight: 1,
      arbitrary: fc.constantFrom(
        "on",
        "true",
        "Routine check after the pump was replaced.",
        "Fennmoor hostile-input test",
      ),
    },
    { weight: 1, arbitrary: hostileText(words, ids) },
  );
}

/**
 * FormData entries of two kinds: a few arbitrary fields (missing, repeated, strings of every kind,
 * files, a JSON payload), or most of the endpoint's fields with values that could be right, so
 * the schema sometimes passes and the service is reached.
 */
export function hostileForm(
  keys: string[],
  words: string[],
  ids: Record<string, string[]>,
): fc.Arbitrary<[string, string | File][]> {
  const text = hostileText(words, ids);
  const file = fc
    .tuple(fc.string({ maxLength: 20 }), fc.uint8Array({ maxLength: 200 }))
    .map(([name, bytes]) => new File([bytes], name || "x.bin"));
  const payload = fc.oneof(
    hostileJson(keys, words, ids).map((v) => JSON.stringify(v) ?? "null"),
    fc
      .tuple(...keys.map((k) => fc.option(plausible(k, words, ids), { freq: 3 })))
      .map((vs) =>
        JSON.stringify(
          Object.fromEntries(keys.map((k, i) => [k, vs[i]]).filter(([, v]) => v !== null)),
        ),
      ),
    fc.string({ maxLength: 40 }),
    fc.constantFrom("{", "[1,", '{"a":}', "\uFEFF{}"),
  );
  const entry = fc.oneof(
    { weight: 8, arbitrary: fc.tuple(hostileKey(keys), text) },
    { weight: 1, arbitrary: fc.tuple(hostileKey(keys), file) },
    { weight: 2, arbitrary: fc.tuple(fc.constant("payload"), payload) },
  );
  const arbitrary = fc.array(entry, { maxLength: 12 });
  const fields = keys.filter((k) => k !== "payload");
  const likely = fc
    .tuple(
      ...fields.map((k) => fc.option(plausible(k, words, ids), { freq: 6 })),
      fc.option(payload, { freq: 2 }),
    )
    .map(
      (vs) =>
        [
          ...fields.map((k, i) => [k, vs[i]] as const),
          ["payload", vs[fields.length]] as const,
        ].filter(([, v]) => v !== null) as [string, string][],
    );
  return fc.oneof(arbitrary, likely) as fc.Arbitrary<[string, string | File][]>;
}

export function toFormData(entries: [string, string | File][]): FormData {
  const form = new FormData();
  for (const [k, v] of entries) form.append(k, v);
  return form;
}

const STACK = /\n\s+at\s|\bat \S+ \(\S+:\d+:\d+\)|\.[jt]sx?:\d+/;
const SQL =
  /SQLITE_|\bSQL\b|constraint failed|no such (table|column)|\binsert into\b|\bselect \S+ from\b|syntax error/i;
const SERVER_ERROR = /something went wrong on the server/i;

/** Why a refusal's message is not one a person can act on, or null when it is. */
export function badMessage(message: unknown): string | null {
  if (typeof message !== "string" || message.trim() === "") return "no message";
  if (STACK.test(message)) return "a stack trace in the message";
  if (SQL.test(message)) return "SQL in the message";
  if (SERVER_ERROR.test(message))
    return "an unexpected server error (an input the schema let through)";
  return null;
}

/** Audit events a refusal may write on purpose: a wrong password is counted, and may lock the account. */
const DELIBERATE_ON_REFUSAL = new Set(["auth.sign_in_failed", "auth.locked_out"]);

export async function auditSeq(client: Client): Promise<number> {
  return Number(
    (await client.execute("SELECT coalesce(max(seq), 0) AS s FROM audit_events")).rows[0].s,
  );
}

/** The tables a refused call changed, apart from the failed-password events it must record. */
export async function writesOnRefusal(
  client: Client,
  changed: string[],
  seqBefore: number,
): Promise<string[]> {
  if (!changed.includes("audit_events")) return changed;
  const rows = await client.execute({
    sql: "SELECT action FROM audit_events WHERE seq > ?",
    args: [seqBefore],
  });
  const onlyDeliberate = rows.rows.every((r) => DELIBERATE_ON_REFUSAL.has(String(r.action)));
  return changed.filter((t) => !(t === "audit_events" && onlyDeliberate));
}
