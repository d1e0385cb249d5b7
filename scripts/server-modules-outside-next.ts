/**
 * Scripts that run the server's own services outside Next.js (the demo seed, the browser-test
 * server, the benchmark) load modules marked "server-only". Inside Next that marker keeps them out
 * of the browser's bundle; a script has no browser bundle, so here the marker resolves to nothing.
 * Import this first, then load the services with a dynamic import().
 */
import Module, { register } from "node:module";

const EMPTY = "data:text/javascript,";
register(
  EMPTY +
    encodeURIComponent(
      `export async function resolve(specifier, context, next) {
        if (specifier === "server-only") return { url: ${JSON.stringify(EMPTY)}, shortCircuit: true };
        return next(specifier, context);
      }`,
    ),
);

// require() from modules compiled to CommonJS resolves through here instead.
const emptyModule = new URL("./empty-module.cjs", import.meta.url).pathname;
type Resolve = (request: string, ...rest: unknown[]) => string;
const loader = Module as unknown as { _resolveFilename: Resolve };
const original = loader._resolveFilename;
loader._resolveFilename = (request, ...rest) =>
  request === "server-only" ? emptyModule : original(request, ...rest);
