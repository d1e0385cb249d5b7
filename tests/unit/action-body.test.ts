import { execFileSync } from "node:child_process";
import { createRequire } from "node:module";
import fc from "fast-check";
import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import {
  isDecodableActionBody,
  MALFORMED_ACTION_BODY,
  type ActionBody,
} from "@/lib/http/action-body";
import { proxy } from "@/proxy";

const require = createRequire(import.meta.url);
const { encodeReply } = require("next/dist/compiled/react-server-dom-webpack/client.node") as {
  encodeReply: (value: unknown) => Promise<string | FormData>;
};

type Wire = { text: string } | { fields: [string, string][] };

/** What the framework's decoder makes of each body, decided by the decoder itself in a react-server process. */
function decode(bodies: Wire[]): string[] {
  const out = execFileSync(
    process.execPath,
    ["--conditions=react-server", "tests/unit/support/decode-reply.mjs"],
    { input: JSON.stringify(bodies), encoding: "utf8", timeout: 60_000 },
  );
  return JSON.parse(out) as string[];
}

const asBody = (w: Wire): ActionBody =>
  "text" in w ? { kind: "text", text: w.text } : { kind: "form", fields: new Map(w.fields) };

// References the decoder understands, some of which our clients never send, and broken ones.
const refs = [
  "$u",
  "$$x",
  "$K1",
  "$K",
  "$Kz",
  "$D2026-01-01",
  "$n12",
  "$n1.5",
  "$NaN",
  "$Infinity",
  "$-0",
  "$@1",
  "$F1",
  "$Q0",
  "$W0",
  "$T",
  "$B1",
  "$R1",
  "$h1",
  "$E",
  "$1",
  "$i1",
  "$Z",
  "$",
];
const leaf = fc.oneof(
  fc.constantFrom(...refs),
  fc.string({ maxLength: 8 }),
  fc.integer(),
  fc.boolean(),
  fc.constant(null),
);
const json = fc.letrec((tie) => ({
  value: fc.oneof(
    { depthSize: "small" },
    leaf,
    fc.array(tie("value"), { maxLength: 3 }),
    fc.dictionary(fc.string({ maxLength: 4 }), tie("value"), { maxKeys: 3 }),
  ),
})).value;
const wire: fc.Arbitrary<Wire> = fc.oneof(
  json.map((v) => ({ text: JSON.stringify(v) })),
  fc.array(json, { maxLength: 3 }).map((v) => ({ text: JSON.stringify(v) })),
  fc.string({ maxLength: 20 }).map((text) => ({ text })),
  fc.tuple(fc.array(json, { maxLength: 3 }), fc.boolean()).map(([v, withRoot]) => ({
    fields: [
      ...(withRoot ? [["0", JSON.stringify(v)] as [string, string]] : []),
      ["1_runId", "x"] as [string, string],
    ],
  })),
);

describe("server-action bodies checked before the framework decodes them", () => {
  it("every body the check lets through decodes into a list of arguments; it never passes one the decoder throws on", () => {
    const bodies = fc.sample(wire, { numRuns: 400, seed: 17 });
    const decoded = decode(bodies);
    const passedButBroken = bodies
      .filter((b, i) => isDecodableActionBody(asBody(b)) && decoded[i] !== "arguments")
      .map((b, i) => [b, decoded[i]]);
    expect(passedButBroken).toEqual([]);
    // The sample is not trivially refused: a good share of it decodes and is let through.
    expect(bodies.filter((b) => isDecodableActionBody(asBody(b))).length).toBeGreaterThan(50);
  });

  it("refuses the bodies that made the framework answer 500", () => {
    const broken: Wire[] = [
      { text: "" },
      { text: "[" },
      { text: "{" },
      { text: "hello" },
      { text: '"x"' },
      { text: "null" },
      { text: '["$F1"]' },
      { text: '["$B1"]' },
      { text: '["$Q0"]' },
      { text: '["$h1"]' },
      { text: '["$T"]' },
      { fields: [["1_runId", "x"]] },
      { fields: [["0", "{bad"]] },
    ];
    const decoded = decode(broken);
    // Each of these either throws in the decoder or is not a list the framework can spread as arguments.
    expect(decoded.every((d) => d !== "arguments")).toBe(true);
    for (const b of broken) expect(isDecodableActionBody(asBody(b)), JSON.stringify(b)).toBe(false);
    expect(MALFORMED_ACTION_BODY).toMatch(/nothing was saved/);
  });

  it("lets through what our forms and the editor's autosave send", async () => {
    const form = new FormData();
    form.set("runId", "3f1c2b9e-0000-4000-8000-000000000000");
    form.set("reason", "$ starts with a dollar");
    const sent = [
      await encodeReply([null, form]),
      await encodeReply([{ ok: false, message: "$x", fieldErrors: { a: ["b"] } }, form]),
      await encodeReply([
        { versionId: "v", content: { type: "doc", content: [] }, overwrite: false, lockVersion: 3 },
      ]),
    ];
    for (const s of sent) {
      const body: ActionBody =
        typeof s === "string"
          ? { kind: "text", text: s }
          : { kind: "form", fields: new Map([...s.entries()].map(([k, v]) => [k, v])) };
      expect(isDecodableActionBody(body)).toBe(true);
    }
  });
});

describe("the proxy in front of every page", () => {
  const post = (body: BodyInit, headers: Record<string, string>, path = "/documents") =>
    new NextRequest(`http://127.0.0.1:3000${path}`, {
      method: "POST",
      body,
      headers: { host: "127.0.0.1:3000", origin: "http://127.0.0.1:3000", ...headers },
    });

  it("answers a broken server-action body with 400 and a plain sentence instead of letting the framework answer 500", async () => {
    for (const [body, type] of [
      ["[", "text/plain;charset=UTF-8"],
      ['"x"', "text/plain;charset=UTF-8"],
      ["--x\r\nbroken", "multipart/form-data; boundary=x"],
    ]) {
      const res = await proxy(post(body, { "next-action": "7f".repeat(21), "content-type": type }));
      expect(res.status, body).toBe(400);
      expect(await res.json()).toEqual({ error: MALFORMED_ACTION_BODY });
    }
    // A form posted without JavaScript whose multipart body cannot be read.
    expect(
      (await proxy(post("--x\r\nbroken", { "content-type": "multipart/form-data; boundary=x" })))
        .status,
    ).toBe(400);
  });

  it("passes on a body our forms send, and leaves /api bodies to their route handlers", async () => {
    const form = new FormData();
    form.set("runId", "r");
    const encoded = await encodeReply([null, form]);
    const ok = await proxy(post(encoded as BodyInit, { "next-action": "7f".repeat(21) }));
    expect(ok.headers.get("x-middleware-next")).toBe("1");
    const api = await proxy(
      post("{", { "content-type": "application/json" }, "/api/evidence/runs/x/import"),
    );
    expect(api.headers.get("x-middleware-next")).toBe("1");
  });
});
