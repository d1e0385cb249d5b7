import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { evidenceFiles, partFamilies, recipes, recipeVersions, users } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { toCsv } from "@/lib/csv/to-csv";
import { checkUpload, sanitizeFileName } from "@/lib/evidence/files";
import { isCrossSiteApiRead, isCrossSiteWrite, type OriginInput } from "@/lib/http/origin";
import { securityHeaders } from "@/lib/http/security-headers";
import { localStore, setStore } from "@/lib/storage";
import { createRun } from "@/lib/server/evidence/create-run";
import { storeEvidenceFile, uploadLimitBytes } from "@/lib/server/evidence/store-file";
import { renderEmail } from "@/templates/email/layout";
import { createTestDatabase } from "./support/test-db";

const MB = 1024 * 1024;
const enc = (s: string) => new TextEncoder().encode(s);
const PDF = enc("%PDF-1.7\n%%EOF\n");

describe("CSV export neutralises formulas", () => {
  // [practice] OWASP "CSV Injection": = + - @ and a leading tab or CR start a formula in common spreadsheets.
  const hostile = [
    "=1+1",
    "+SUM(A1)",
    "-2+3",
    "@SUM(1)",
    "\tcmd",
    "\rcmd",
    '=HYPERLINK("https://evil.example","x")\nsecond line',
    "=cmd|' /C calc'!A0\r\nmore",
  ];
  it("prefixes every formula-like cell with a quote, also when the cell runs over several lines", () => {
    const rows = Papa.parse<string[]>(
      toCsv(
        ["v"],
        hostile.map((h) => [h]),
      ),
      { newline: "\r\n" },
    ).data.slice(1);
    expect(rows.map((r) => r[0])).toEqual(hostile.map((h) => `'${h}`));
  });
  it("leaves ordinary text, numbers and inner signs alone", () => {
    const csv = toCsv(["a", "b", "c"], [["Tank 1 = wash", -5, "a-b@c"]]);
    expect(csv.split("\r\n")[1]).toBe("Tank 1 = wash,-5,a-b@c");
  });
});

describe("uploads that lie about their type or name", () => {
  const cases: [string, Uint8Array, RegExp][] = [
    ["report.png", PDF, /named as a PNG image, but its contents are a PDF/],
    [
      "report.pdf",
      enc("<!doctype html><script>alert(1)</script>"),
      /named as a PDF, but its contents are an HTML page/,
    ],
    // An HTML file renamed .png was called "a CSV table": name what it is.
    [
      "photo.png",
      enc("<html><body><script>alert(1)</script></body></html>"),
      /named as a PNG image, but its contents are an HTML page, not a PDF, PNG, JPEG or CSV file/,
    ],
    [
      "readings.csv",
      enc("<!DOCTYPE html>\n<p>a,b</p>"),
      /named as a CSV table, but its contents are an HTML page/,
    ],
    [
      "drawing.png",
      enc('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg"/>'),
      /contents are an SVG image/,
    ],
    ["notes.pdf", enc("just some words"), /named as a PDF, but its contents are plain text/],
    ["scan.jpg", new Uint8Array([0x47, 0x49, 0x46, 0x38, 0x39, 0x61]), /contents are a GIF image/],
    [
      "drawing.pdf",
      enc('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>'),
      /named as a PDF/,
    ],
    [
      "drawing.png",
      enc('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'),
      /named as a PNG image/,
    ],
    ["drawing.svg", enc("<svg/>"), /is not a PDF, PNG, JPEG or CSV file/],
    ["page.html", enc("<p>hi</p>"), /is not a PDF, PNG, JPEG or CSV file/],
    ["setup.exe", new Uint8Array([0x4d, 0x5a, 0x90, 0, 3]), /is not a PDF, PNG, JPEG or CSV file/],
    [
      "setup.pdf",
      new Uint8Array([0x4d, 0x5a, 0x90, 0, 3]),
      /contents are a Windows program, not a PDF, PNG, JPEG or CSV file/,
    ],
    [
      "archive.csv",
      new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0, 0]),
      /contents are a ZIP archive \(or an Office document\), not a PDF, PNG, JPEG or CSV file/,
    ],
  ];
  it.each(cases)("refuses %s", (name, bytes, message) => {
    expect(() => checkUpload({ name, bytes, maxBytes: 25 * MB })).toThrow(message);
  });

  const names: [string, RegExp][] = [
    ["../../etc/passwd", /folder path/],
    ["..\\x.pdf", /folder path/],
    ["a/../../b.pdf", /folder path/],
    ["report..pdf", /folder path/],
    ["report\u0000.pdf", /control characters/],
    ["report\r\nContent-Type: text/html.pdf", /control characters/],
    ["\u001b[31mred.pdf", /control characters/],
    [".env", /starts with a dot/],
    ["   ", /no name/],
  ];
  it.each(names)("refuses the name %j", (name, message) => {
    expect(() => sanitizeFileName(name)).toThrow(message);
  });

  it("shortens a very long name to 120 characters and keeps its extension", () => {
    const name = sanitizeFileName(`${"ä".repeat(5000)}.pdf`);
    expect(name).toHaveLength(120); // [derived] MAX_NAME in lib/evidence/files.ts
    expect(name.endsWith(".pdf")).toBe(true);
  });
  it("turns markup and quote characters into underscores, so a name is never markup or a header break-out", () => {
    expect(sanitizeFileName('x"><img src=1 onerror=alert(1)>.pdf')).toBe(
      "x___img src_1 onerror_alert(1)_.pdf",
    );
    expect(sanitizeFileName("a;b'c`d.pdf")).toBe("a_b_c_d.pdf");
  });
});

describe("origin check on state-changing requests", () => {
  const base: OriginInput = {
    method: "POST",
    origin: "http://127.0.0.1:3100",
    secFetchSite: "same-origin",
    host: "127.0.0.1:3100",
    forwardedHost: null,
    appUrl: "http://127.0.0.1:3100",
    hasSessionCookie: true,
  };
  it("lets our own origin and safe methods through", () => {
    expect(isCrossSiteWrite(base)).toBe(false);
    expect(
      isCrossSiteWrite({
        ...base,
        method: "GET",
        origin: "https://evil.example",
        secFetchSite: "cross-site",
      }),
    ).toBe(false);
    expect(
      isCrossSiteWrite({ ...base, host: "10.0.0.5:3000", forwardedHost: "127.0.0.1:3100" }),
    ).toBe(false);
    expect(isCrossSiteWrite({ ...base, origin: null, secFetchSite: null })).toBe(false);
  });
  it("refuses another site, a look-alike host, another port, a null origin and a cross-site fetch without Origin", () => {
    for (const origin of [
      "https://evil.example",
      "http://127.0.0.1.evil.example",
      "http://127.0.0.1:3101",
      "null",
      "file:///x",
      "not a url",
    ]) {
      expect(isCrossSiteWrite({ ...base, origin }), origin).toBe(true);
    }
    for (const method of ["PUT", "PATCH", "DELETE", "post"])
      expect(isCrossSiteWrite({ ...base, method, origin: "https://evil.example" }), method).toBe(
        true,
      );
    expect(isCrossSiteWrite({ ...base, origin: null, secFetchSite: "cross-site" })).toBe(true);
    expect(isCrossSiteWrite({ ...base, origin: null, secFetchSite: "same-site" })).toBe(true);
  });
  it("leaves requests without the session cookie to their bearer token", () => {
    expect(
      isCrossSiteWrite({ ...base, origin: "https://evil.example", hasSessionCookie: false }),
    ).toBe(false);
  });
});

describe("cross-site reads of audited /api routes", () => {
  const base = {
    method: "GET",
    path: "/api/audit-events/export",
    secFetchSite: "same-origin",
    hasSessionCookie: true,
  };
  it("refuses a link or image on another site that would export or download in the user's name", () => {
    for (const path of ["/api/audit-events/export", "/api/audit-pack/x", "/api/evidence/files/y"]) {
      expect(isCrossSiteApiRead({ ...base, path, secFetchSite: "cross-site" }), path).toBe(true);
      expect(isCrossSiteApiRead({ ...base, path, secFetchSite: "same-site" }), path).toBe(true);
    }
  });
  it("lets our own pages, a typed address or bookmark, token clients and pages through", () => {
    expect(isCrossSiteApiRead(base)).toBe(false);
    expect(isCrossSiteApiRead({ ...base, secFetchSite: "none" })).toBe(false);
    expect(isCrossSiteApiRead({ ...base, secFetchSite: null })).toBe(false);
    expect(
      isCrossSiteApiRead({ ...base, secFetchSite: "cross-site", hasSessionCookie: false }),
    ).toBe(false);
    expect(
      isCrossSiteApiRead({ ...base, path: "/api/v1/recipes", secFetchSite: "cross-site" }),
    ).toBe(false);
    expect(isCrossSiteApiRead({ ...base, path: "/changes", secFetchSite: "cross-site" })).toBe(
      false,
    );
    expect(isCrossSiteApiRead({ ...base, method: "POST", secFetchSite: "cross-site" })).toBe(false);
  });
});

describe("e-mail", () => {
  it("escapes hostile titles and comments in the HTML part and keeps them whole in the text part", () => {
    const hostile = `<script>alert(1)</script><img src=x onerror="alert(1)">`;
    const mail = renderEmail({ subject: hostile, paragraphs: [`Sent back: ${hostile}`] });
    expect(mail.html).not.toMatch(/<script|<img/);
    expect(mail.html).toContain(
      "&lt;script&gt;alert(1)&lt;/script&gt;&lt;img src=x onerror=&quot;alert(1)&quot;&gt;",
    );
    expect(mail.text).toContain(hostile);
  });
});

describe("security headers", () => {
  it("pins HTTPS only in production over HTTPS, and never allows eval in production", () => {
    expect(securityHeaders({ nonce: "n", dev: false, https: true }).hsts).toBe(
      "max-age=63072000; includeSubDomains",
    );
    expect(securityHeaders({ nonce: "n", dev: false, https: false }).hsts).toBeNull();
    expect(securityHeaders({ nonce: "n", dev: true, https: true }).hsts).toBeNull();
    const csp = securityHeaders({ nonce: "abc", dev: false, https: true }).csp;
    expect(csp).toContain("script-src 'self' 'nonce-abc' 'strict-dynamic'");
    expect(csp).not.toContain("unsafe-eval");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("upgrade-insecure-requests");
  });
});

describe("upload size at the service, with a small limit", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  const storeDir = mkdtempSync(join(tmpdir(), "washproof-hostile-"));
  let runId = "";
  let tech = { id: "", name: "" };
  beforeAll(async () => {
    process.env.UPLOAD_MAX_MB = "0.01"; // 10 KiB; env() is read lazily, first here
    t = await createTestDatabase();
    setStore(localStore(storeDir));
    await seedDemo(t.db);
    [tech] = await t.db
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(eq(users.email, "technician@fennmoor.example"));
    const [family] = await t.db
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.code, "PF-VB-210"));
    const [version] = await t.db
      .select({ id: recipeVersions.id })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
    runId = (
      await createRun(tech, {
        partFamilyId: family.id,
        recipeVersionId: version.id,
        testType: "gravimetric",
        technicianId: tech.id,
        lab: "Larchfield lab",
        performedOn: "2026-11-20",
      } as never)
    ).id;
  });
  afterAll(() => {
    t.cleanup();
    rmSync(storeDir, { recursive: true, force: true });
    delete process.env.UPLOAD_MAX_MB;
  });

  it("refuses a file one byte over UPLOAD_MAX_MB and stores nothing, and takes one at the limit", async () => {
    expect(uploadLimitBytes()).toBe(10486); // [derived] round(0.01 × 1 048 576)
    const over = new Uint8Array(uploadLimitBytes() + 1);
    over.set(PDF);
    const stored = readdirSync(storeDir, { recursive: true });
    await expect(
      storeEvidenceFile(tech, { runId, name: "big.pdf", bytes: over, kind: "lab_report" }),
    ).rejects.toThrow("The file is 10.2 kB; the limit is 10.2 kB.");
    expect(
      await t.db.select().from(evidenceFiles).where(eq(evidenceFiles.runId, runId)),
    ).toHaveLength(0);
    expect(readdirSync(storeDir, { recursive: true })).toEqual(stored);
    const fits = over.slice(0, uploadLimitBytes());
    const { file } = await storeEvidenceFile(tech, {
      runId,
      name: "fits.pdf",
      bytes: fits,
      kind: "lab_report",
    });
    expect(file.sizeBytes).toBe(uploadLimitBytes());
  });

  it("refuses a traversal name at the service and writes no byte outside the store", async () => {
    const stored = readdirSync(storeDir, { recursive: true });
    const before = (await t.db.select().from(evidenceFiles)).length;
    for (const name of ["../../etc/passwd.pdf", "..\\..\\x.pdf", "a\u0000.pdf"]) {
      await expect(
        storeEvidenceFile(tech, { runId, name, bytes: PDF, kind: "lab_report" }),
        name,
      ).rejects.toThrow(/folder path|control characters/);
    }
    expect(await t.db.select().from(evidenceFiles)).toHaveLength(before);
    expect(readdirSync(storeDir, { recursive: true })).toEqual(stored);
  });
});
