/**
 * A server-action request body checked before the framework decodes it. The framework answers a
 * body it cannot decode (not JSON, an unknown reference, arguments that are not a list) with a
 * bare 500; our own clients never send one, so anything else is refused here with a 400 and a
 * plain sentence. Pure: the proxy reads the body and passes it in.
 *
 * What our clients send (React's reply encoding): the arguments as one JSON array, either as the
 * whole body or in the multipart field "0", where a form travels as "$K<id>" with its fields named
 * "<id>_<name>". Strings that begin with "$" are escaped as "$$"; "$u" is undefined, "$D" a date,
 * "$n" a bigint, "$NaN", "$Infinity", "$-Infinity", "$-0" numbers. Any other reference (a promise,
 * a map, a stream, a server reference, a blob) is never sent by a form or by the editor's autosave.
 */

export const MALFORMED_ACTION_BODY =
  "The request could not be read: it is not a form this application sends. Reload the page and try again; nothing was saved.";

/** Deep enough for any form's state; deeper JSON is an attack on the decoder's recursion. */
const MAX_DEPTH = 32;
const SCALAR_REFS = /^\$(u|NaN|Infinity|-Infinity|-0|D.*|n-?\d+)$/s;
const FORM_REF = /^\$K[0-9a-f]+$/;

export type ActionBody =
  { kind: "text"; text: string } | { kind: "form"; fields: ReadonlyMap<string, unknown> };

function refsAreKnown(value: unknown, depth: number): boolean {
  if (depth > MAX_DEPTH) return false;
  // A form reference whose fields are missing decodes to an empty form: harmless, the action refuses it.
  if (typeof value === "string")
    return (
      !value.startsWith("$") ||
      value.startsWith("$$") ||
      SCALAR_REFS.test(value) ||
      FORM_REF.test(value)
    );
  if (Array.isArray(value)) return value.every((v) => refsAreKnown(v, depth + 1));
  if (value && typeof value === "object")
    return Object.values(value).every((v) => refsAreKnown(v, depth + 1));
  return true;
}

/** Whether the framework can decode this body into a list of arguments without throwing. */
export function isDecodableActionBody(body: ActionBody): boolean {
  const rootText = body.kind === "text" ? body.text : body.fields.get("0");
  if (typeof rootText !== "string") return false;
  let root: unknown;
  try {
    root = JSON.parse(rootText);
  } catch {
    return false;
  }
  // The framework spreads the decoded value as the action's arguments: it must be a list.
  if (!Array.isArray(root)) return false;
  return refsAreKnown(root, 0);
}

/** A server action the page's JavaScript calls carries the action's id in this header. */
export const isFetchAction = (method: string, headers: Headers) =>
  method === "POST" && headers.has("next-action");
