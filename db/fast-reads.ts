import type { Client, InArgs, InStatement, ResultSet, Row } from "@libsql/client";
import Database from "libsql";
import { wrapClient } from "./wrap-client";

/**
 * Plain reads, outside any transaction, through statements prepared once per SQL text on a
 * read-only connection of their own.
 *
 * The client's file driver prepares every statement again and builds each row with one property
 * definition per value. At plant size that was 5.5 ms of My queue's 18.8 ms in process (13.4 ms
 * with this path, the same answer; tests/bench/results.md). Writes, transactions and batches go
 * through the client as before, and so does any read this path cannot take exactly as the client
 * would (named arguments, an unusual value, an integer past 2^53, an error): the client then
 * answers, or throws its own error.
 *
 * A second connection changes nothing a reader can see: in WAL mode it reads the last commit, as
 * the client's own connection does (the client already hands its connection to each transaction
 * and opens another). Rows keep the client's shape: columns by name (enumerable, the first of a
 * repeated name) and by index, with a length.
 */
export function withFastReads(client: Client, path: string, timeoutMs: number): Client {
  const statements = new Map<string, Prepared | null>();
  let connection: Connection | null = null;

  function open(): Connection {
    if (!connection) {
      connection = new Database(path, { timeout: timeoutMs });
      connection.exec("PRAGMA query_only = 1");
    }
    return connection;
  }

  /** The statement kept for this text, or null when it is not a read this path may take. */
  function prepared(sql: string): Prepared | null {
    const kept = statements.get(sql);
    if (kept !== undefined) {
      // Most recently used last, so the oldest is the one let go.
      statements.delete(sql);
      statements.set(sql, kept);
      return kept;
    }
    const statement = open().prepare(sql);
    const usable = statement.reader ? prepare(statement) : null;
    statements.set(sql, usable);
    if (statements.size > MAX_KEPT) statements.delete(statements.keys().next().value!);
    return usable;
  }

  function read(stmt: InStatement): ResultSet | null {
    const sql = typeof stmt === "string" ? stmt : stmt.sql;
    if (!SELECT.test(sql)) return null;
    const args = typeof stmt === "string" ? [] : argsToSql(stmt.args);
    if (!args) return null;
    try {
      const statement = prepared(sql);
      return statement ? statement.run(args) : null;
    } catch {
      return null; // the client runs it again and reports the error in its own words
    }
  }

  return wrapClient(client, {
    execute(stmt: InStatement | string, args?: InArgs) {
      const statement: InStatement = typeof stmt === "string" && args ? { sql: stmt, args } : stmt;
      const result = read(statement);
      return result ? Promise.resolve(result) : client.execute(statement);
    },
    close() {
      connection?.close();
      connection = null;
      statements.clear();
      client.close();
    },
  });
}

/** Enough for every query text the app builds, with room for the IN lists of varying length. */
const MAX_KEPT = 500;
const SELECT = /^\s*select\b/i;

interface Prepared {
  run(args: unknown[]): ResultSet | null;
}

type Connection = InstanceType<typeof Database>;
type Statement = ReturnType<Connection["prepare"]>;

function prepare(statement: Statement): Prepared {
  statement.safeIntegers(true);
  statement.raw(true);
  const described = statement.columns() as { name: string; type: string | null }[];
  const columns = described.map((c) => c.name);
  const columnTypes = described.map((c) => c.type ?? "");
  const StatementRow = rowClass(columns.length);
  // Each name once, at its first index, as the client does.
  const named = columns.flatMap((name, i) => (columns.indexOf(name) === i ? [[name, i]] : [])) as [
    string,
    number,
  ][];
  return {
    run(args) {
      const raw = statement.all(args) as unknown[][];
      const rows: Row[] = new Array(raw.length);
      for (let r = 0; r < raw.length; r++) {
        const values = raw[r];
        for (let i = 0; i < values.length; i++) {
          const value = valueFromSql(values[i]);
          if (value === UNSAFE) return null;
          values[i] = value;
        }
        const row = new StatementRow(values) as unknown as Record<string, unknown>;
        for (const [name, i] of named) row[name] = values[i];
        rows[r] = row as unknown as Row;
      }
      return resultSet(columns, columnTypes, rows);
    },
  };
}

/** A row's values, private so that only the column names enumerate and spread, as the client's. */
class RowValues {
  readonly #values: unknown[];
  constructor(values: unknown[]) {
    this.#values = values;
  }
  static at(row: RowValues, i: number) {
    return row.#values[i];
  }
}

/** Rows of one statement: by index and length through its values, by name as own properties. */
function rowClass(width: number): new (values: unknown[]) => RowValues {
  class StatementRow extends RowValues {}
  for (let i = 0; i < width; i++)
    Object.defineProperty(StatementRow.prototype, i, {
      get(this: RowValues) {
        return RowValues.at(this, i);
      },
    });
  Object.defineProperty(StatementRow.prototype, "length", { value: width });
  return StatementRow;
}

function resultSet(columns: string[], columnTypes: string[], rows: Row[]): ResultSet {
  return {
    columns,
    columnTypes,
    rows,
    rowsAffected: 0,
    lastInsertRowid: undefined,
    toJSON: () => ({
      columns,
      columnTypes,
      rows: rows.map((row) => Array.from(row as ArrayLike<unknown>, valueToJson)),
      rowsAffected: 0,
      lastInsertRowid: null,
    }),
  };
}

/** As the client writes a value into JSON: a blob as base64. */
const valueToJson = (value: unknown) =>
  value instanceof ArrayBuffer ? Buffer.from(value).toString("base64") : value;

const UNSAFE = Symbol("unsafe integer");
const MIN_SAFE = BigInt(Number.MIN_SAFE_INTEGER);
const MAX_SAFE = BigInt(Number.MAX_SAFE_INTEGER);

/** The client's "number" integer mode: a bigint past 2^53 is the client's error to raise. */
function valueFromSql(value: unknown): unknown {
  if (typeof value === "bigint")
    return value < MIN_SAFE || value > MAX_SAFE ? UNSAFE : Number(value);
  if (value instanceof Buffer)
    return value.byteOffset === 0 && value.byteLength === value.buffer.byteLength
      ? value.buffer // the blob's own memory, not a copy: an audit page is megabytes
      : value.buffer.slice(value.byteOffset, value.byteOffset + value.byteLength);
  return value;
}

/** Positional arguments of the kinds the client converts the same way; anything else: null. */
function argsToSql(args: InArgs | undefined): unknown[] | null {
  if (args === undefined) return [];
  if (!Array.isArray(args)) return null;
  const out = new Array(args.length);
  for (let i = 0; i < args.length; i++) {
    const value = args[i];
    if (value === null || typeof value === "string") out[i] = value;
    else if (typeof value === "number" && Number.isFinite(value)) out[i] = value;
    else if (typeof value === "boolean") out[i] = value ? 1 : 0;
    else if (value instanceof Date) out[i] = value.valueOf();
    else return null;
  }
  return out;
}
