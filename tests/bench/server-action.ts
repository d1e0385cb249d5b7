/**
 * Calls a server action over HTTP exactly as the browser does: the action id from
 * the build's server-reference manifest in the Next-Action header, the arguments
 * encoded by React's own reply encoder (here the previous form state and the form).
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { DEMO_PASSWORD } from "@/db/seed-data";

const require = createRequire(import.meta.url);
const { encodeReply } = require("next/dist/compiled/react-server-dom-webpack/client.node") as {
  encodeReply: (value: unknown) => Promise<string | FormData>;
};

/** The id `next build` gave signRunAction in app/(app)/evidence/actions.ts. */
export function signRunActionId(): string {
  const manifest = JSON.parse(
    readFileSync(".next/server/server-reference-manifest.json", "utf8"),
  ) as { node: Record<string, { filename?: string; exportedName?: string }> };
  const found = Object.entries(manifest.node).find(
    ([, a]) => a.filename === "app/(app)/evidence/actions.ts" && a.exportedName === "signRunAction",
  );
  if (!found)
    throw new Error(
      "signRunAction is not in .next/server/server-reference-manifest.json: rebuild with `npx next build`.",
    );
  return found[0];
}

/** The body the signature dialog posts when the technician signs a run as performed. */
export async function encodeSignRunBody(
  runId: string,
  contentHash: string,
): Promise<{ bytes: Buffer; contentType: string }> {
  const form = new FormData();
  form.set("runId", runId);
  form.set("meaning", "performed");
  form.set("contentHash", contentHash);
  form.set("password", DEMO_PASSWORD);
  const encoded = await encodeReply([null, form]);
  const response = new Response(encoded);
  return {
    bytes: Buffer.from(await response.arrayBuffer()),
    contentType: response.headers.get("content-type") ?? "text/plain;charset=UTF-8",
  };
}
