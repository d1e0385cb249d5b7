import {
  LibsqlError,
  type Client,
  type InArgs,
  type InStatement,
  type Transaction,
  type TransactionMode,
} from "@libsql/client";
import { wrapClient } from "./wrap-client";

/**
 * One writer at a time inside this process, queued before SQLite sees it.
 *
 * The file driver runs SQLite synchronously on the event loop. A second write
 * that meets another connection's lock waits in SQLite's busy handler with the
 * event loop blocked, so the transaction holding the lock can never reach its
 * COMMIT: both stall for the whole busy timeout and the second then fails with
 * SQLITE_BUSY. Queuing here lets concurrent requests commit one after another.
 * Reads are not queued (WAL lets them run beside a writer); writers in other
 * processes still meet SQLite's own busy timeout.
 */
export function serialiseWrites(client: Client, timeoutMs: number): Client {
  let tail: Promise<void> = Promise.resolve();

  /** Waits for every earlier writer; gives up after the busy timeout, as SQLite would. */
  async function acquire(): Promise<() => void> {
    let release!: () => void;
    const mine = new Promise<void>((resolve) => (release = resolve));
    const before = tail;
    tail = before.then(() => mine);
    let timer: NodeJS.Timeout | undefined;
    const timedOut = new Promise<never>((_, reject) => {
      timer = setTimeout(
        () =>
          reject(
            new LibsqlError(`SQLITE_BUSY: no turn to write within ${timeoutMs} ms`, "SQLITE_BUSY"),
          ),
        timeoutMs,
      );
    });
    try {
      await Promise.race([before, timedOut]);
    } catch (error) {
      release(); // our turn, when it comes, passes straight on
      throw error;
    } finally {
      clearTimeout(timer);
    }
    let released = false;
    return () => {
      if (released) return;
      released = true;
      release();
    };
  }

  async function queued<T>(run: () => Promise<T>): Promise<T> {
    const release = await acquire();
    try {
      return await run();
    } finally {
      release();
    }
  }

  function wrapTransaction(tx: Transaction, release: () => void): Transaction {
    return {
      execute: (stmt) => tx.execute(stmt),
      batch: (stmts) => tx.batch(stmts),
      executeMultiple: (sql) => tx.executeMultiple(sql),
      async commit() {
        try {
          await tx.commit();
        } finally {
          release();
        }
      },
      async rollback() {
        try {
          await tx.rollback();
        } finally {
          release();
        }
      },
      close() {
        tx.close();
        release();
      },
      get closed() {
        return tx.closed;
      },
    };
  }

  const execute = (stmt: InStatement | string, args?: InArgs) => {
    const statement: InStatement =
      typeof stmt === "string" ? { sql: stmt, args: args ?? [] } : stmt;
    return isRead(statement) ? client.execute(statement) : queued(() => client.execute(statement));
  };

  return wrapClient(client, {
    execute,
    batch: (stmts, mode) =>
      mode === "read" ? client.batch(stmts, mode) : queued(() => client.batch(stmts, mode)),
    migrate: (stmts) => queued(() => client.migrate(stmts)),
    async transaction(mode: TransactionMode = "write") {
      if (mode === "read") return client.transaction(mode);
      const release = await acquire();
      try {
        return wrapTransaction(await client.transaction(mode), release);
      } catch (error) {
        release();
        throw error;
      }
    },
    executeMultiple: (sql) => queued(() => client.executeMultiple(sql)),
  });
}

function isRead(stmt: InStatement) {
  const sql = typeof stmt === "string" ? stmt : stmt.sql;
  return /^\s*select\b/i.test(sql);
}
