import { describe, expect, it } from "vitest";
import { fromPageParams, listSearch, readListParams, rowMatches } from "@/lib/url/list-params";

const DEFAULTS = { testType: "", outcome: "", sort: "performedOn", dir: "desc", page: "1" };

describe("list filters in the address", () => {
  it("reads a linked, filtered list back exactly as it was shared", () => {
    const url = new URL(
      `https://washproof.example/evidence${listSearch({ ...DEFAULTS, testType: "uv_inspection", outcome: "fail", page: "3" }, DEFAULTS)}`,
    );
    expect(url.search).toBe("?testType=uv_inspection&outcome=fail&page=3");
    expect(readListParams(url.searchParams, DEFAULTS)).toEqual({
      ...DEFAULTS,
      testType: "uv_inspection",
      outcome: "fail",
      page: "3",
    });
  });

  it("leaves defaults out, so the unfiltered list keeps a clean address", () => {
    expect(listSearch(DEFAULTS, DEFAULTS)).toBe("");
    expect(listSearch({ ...DEFAULTS, dir: "asc" }, DEFAULTS)).toBe("?dir=asc");
  });

  it("ignores unknown and overlong parameters", () => {
    const search = new URLSearchParams({ colour: "teal", outcome: "x".repeat(500) });
    expect(readListParams(search, DEFAULTS)).toEqual(DEFAULTS);
  });

  it("reads a server page's searchParams the same way, taking the first of repeated values", () => {
    expect(
      readListParams(fromPageParams({ status: ["closed", "open"], other: "x" }), { status: "" }),
    ).toEqual({ status: "closed" });
    expect(readListParams(fromPageParams({}), { status: "" })).toEqual({ status: "" });
  });
});

describe("server list filters", () => {
  it("keeps a row only when every chosen filter matches and every word is found", () => {
    const row = { status: "closed", text: ["CR-2026-001", "Dry fittings at 105 °C"] };
    const match = (status: string, q: string) =>
      rowMatches({ equals: { status: { want: status, have: row.status } }, q, text: row.text });
    expect(match("", "")).toBe(true);
    expect(match("closed", "dry 105")).toBe(true);
    expect(match("open", "")).toBe(false);
    expect(match("closed", "wash")).toBe(false);
  });
});
