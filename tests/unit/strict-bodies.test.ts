import { describe, expect, it } from "vitest";
import { z } from "zod";
import { unknownFieldErrors } from "@/lib/api/strict-keys";
import { particleSampleSchema } from "@/lib/schemas/evidence";
import { JSON_BODY_LIMIT_BYTES, parseBody } from "@/lib/server/api/handler";

const particle = {
  sampleLabel: "P-1",
  worstCase: true,
  components: 1,
  counts: { B: 100 },
  splitMeasured: false,
  largest: {},
};
const post = (body: string, headers: Record<string, string> = {}) =>
  new Request("http://127.0.0.1/api/v1/x", {
    method: "POST",
    headers: { "content-type": "application/json", ...headers },
    body,
  });

describe("unknown keys are refused at any depth, named by their path", () => {
  it("a lower-case particle class is named, with the class it most likely meant", () => {
    // Before: zod's plain object dropped "b", so the sample was stored with no counts at all.
    const errors = unknownFieldErrors(particleSampleSchema, { ...particle, counts: { b: 100 } });
    expect(Object.keys(errors ?? {})).toEqual(["counts.b"]);
    expect(errors?.["counts.b"][0]).toMatch(/did you mean "B"/);
  });

  it("a well-formed sample passes, and so do the schema's own optional groups", () => {
    expect(unknownFieldErrors(particleSampleSchema, particle)).toBeNull();
    expect(
      unknownFieldErrors(particleSampleSchema, {
        ...particle,
        splitMeasured: true,
        metallic: { B: 100 },
        largest: { metallicUm: 200 },
      }),
    ).toBeNull();
  });

  it("looks into lists, records and unions", () => {
    const schema = z.object({
      rows: z.array(z.object({ a: z.number() })),
      byName: z.record(z.string(), z.object({ v: z.number() })),
      either: z.union([z.object({ x: z.number() }), z.object({ y: z.number() })]),
    });
    const errors = unknownFieldErrors(schema, {
      rows: [{ a: 1 }, { a: 1, A: 2 }],
      byName: { k: { v: 1, w: 2 } },
      either: { y: 1 },
      extra: 1,
    });
    expect(Object.keys(errors ?? {}).sort()).toEqual(["byName.k.w", "extra", "rows.1.A"]);
    expect(unknownFieldErrors(schema, { rows: [], byName: {}, either: { x: 1 } })).toBeNull();
  });

  it("an object open by design (catchall) takes any key", () => {
    expect(
      unknownFieldErrors(z.object({ a: z.number() }).catchall(z.number()), { a: 1, b: 2 }),
    ).toBeNull();
    expect(unknownFieldErrors(z.object({ a: z.number() }).strict(), { a: 1, b: 2 })).not.toBeNull();
  });
});

describe("parseBody", () => {
  it("refuses an unknown nested key with 422 naming it, and stores nothing (the caller never sees data)", async () => {
    const res = await parseBody(
      post(JSON.stringify({ ...particle, counts: { b: 100 } })),
      particleSampleSchema,
    );
    expect(res.ok).toBe(false);
    if (res.ok) return;
    expect(res.response.status).toBe(422);
    const json = await res.response.json();
    expect(json.error).toMatch(/"counts\.b"/);
    expect(Object.keys(json.fieldErrors)).toEqual(["counts.b"]);
  });

  it("a body over the limit is 413 saying the limit, not 'not valid JSON' — by declared length and by counting", async () => {
    const big = JSON.stringify({ sampleLabel: "x".repeat(JSON_BODY_LIMIT_BYTES + 10) });
    for (const request of [
      post(big),
      // No declared length: a streamed body is counted as it arrives.
      new Request("http://127.0.0.1/api/v1/x", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: new ReadableStream({
          start(c) {
            c.enqueue(new TextEncoder().encode(big));
            c.close();
          },
        }),
        duplex: "half",
      } as RequestInit),
    ]) {
      const res = await parseBody(request, particleSampleSchema);
      expect(res.ok).toBe(false);
      if (res.ok) continue;
      expect(res.response.status).toBe(413);
      expect((await res.response.json()).error).toMatch(/1 MB limit/);
    }
  });

  it("malformed JSON under the limit is still 400", async () => {
    const res = await parseBody(post("{not json"), particleSampleSchema);
    expect(res.ok ? 0 : res.response.status).toBe(400);
  });
});
