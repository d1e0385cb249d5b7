import type { Client } from "@libsql/client";

/** The operations a wrapper may take over; the rest, and the client's state, pass through. */
type Operations = Pick<
  Client,
  "execute" | "batch" | "migrate" | "transaction" | "executeMultiple" | "sync" | "close"
>;

/** A client that answers with `own` where given and with `client` everywhere else. */
export function wrapClient(client: Client, own: Partial<Operations>): Client {
  return {
    execute: (stmt: Parameters<Client["execute"]>[0], args?: Parameters<Client["execute"]>[1]) =>
      client.execute(stmt as never, args),
    batch: (stmts, mode) => client.batch(stmts, mode),
    migrate: (stmts) => client.migrate(stmts),
    transaction: (mode) => client.transaction(mode),
    executeMultiple: (sql) => client.executeMultiple(sql),
    sync: () => client.sync(),
    close: () => client.close(),
    ...own,
    reconnect: () => client.reconnect(),
    get closed() {
      return client.closed;
    },
    get protocol() {
      return client.protocol;
    },
  } as Client;
}
