import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { changeRequests, users } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { localStore, setStore } from "@/lib/storage";
import { loadAuditPack, type AuditPack } from "@/lib/server/trace/audit-pack";
import { exportAuditPack } from "@/lib/server/trace/export-audit-pack";
import { writeCheckpoint } from "@/lib/server/audit/write-checkpoint";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const storeDir = mkdtempSync(join(tmpdir(), "washproof-pack-pdf-"));
let pack: AuditPack;
let checkpoint: { hash: string; signature: string };
/** The PDF as pdftotext reads it, line by line (layout kept, so a hash broken or cut shows as such). */
let lines: string[] = [];
let raw = "";
/** The same PDF in drawing order (-raw): a table cell's lines stay together. */
let inOrder = "";

beforeAll(async () => {
  setStore(localStore(storeDir));
  t = await createTestDatabase();
  await seedDemo(t.db);
  const [auditor] = await t.db
    .select()
    .from(users)
    .where(eq(users.email, "auditor@fennmoor.example"));
  const [cr] = await t.db
    .select()
    .from(changeRequests)
    .where(eq(changeRequests.number, "CR-2026-001"));
  const written = await writeCheckpoint("schedule");
  if (!written.written) throw new Error(written.reason);
  checkpoint = written.checkpoint;
  pack = await loadAuditPack(t.db, cr.id);
  const pdf = await exportAuditPack(
    { id: auditor.id, name: auditor.name },
    { changeRequestId: cr.id, format: "pdf" },
  );
  const dir = mkdtempSync(join(tmpdir(), "washproof-pack-"));
  writeFileSync(join(dir, "pack.pdf"), pdf.bytes);
  raw = execFileSync("pdftotext", ["-layout", join(dir, "pack.pdf"), "-"], { encoding: "utf8" });
  lines = raw.split("\n");
  inOrder = execFileSync("pdftotext", ["-raw", join(dir, "pack.pdf"), "-"], {
    encoding: "utf8",
  }).replace(/\s+/g, " ");
  rmSync(dir, { recursive: true, force: true });
}, 120_000);
afterAll(() => {
  setStore(undefined);
  t.cleanup();
  rmSync(storeDir, { recursive: true, force: true });
});

/** Every hash the pack prints: the record's, each signature's, each file's and each event's. */
const allHashes = () => [
  pack.contentHash,
  ...pack.signatures.map((x) => x.contentHash),
  ...pack.evidence.flatMap((r) => [
    ...r.signatures.map((x) => x.contentHash),
    ...r.files.map((f) => f.sha256),
  ]),
  ...pack.events.map((e) => e.hash),
];

describe("audit pack PDF as an auditor reads it (pdftotext)", () => {
  it("numbers its sections: headings read “1. The record”, never “. The record”", () => {
    const headings = [
      "1. The record",
      "2. Justification and risk assessment",
      "3. Parameter diff",
      "4. Impact",
      "5. Electronic signatures",
      "6. Requalification evidence",
      "7. Evidence files and their hashes",
      "8. Audit extract",
    ];
    for (const h of headings) {
      expect(
        lines.some((l) => l.trim() === h),
        h,
      ).toBe(true);
      expect(inOrder).toContain(` ${h} `);
    }
    expect(lines.some((l) => /^\s*\. [A-Z]/.test(l))).toBe(false);
  });

  it("prints every hash whole on one line: never hyphenated, broken or cut at the page edge", () => {
    const hashes = [...allHashes(), checkpoint.hash, checkpoint.signature];
    expect(hashes.length).toBeGreaterThan(20);
    for (const h of hashes)
      expect(
        lines.some((l) => l.includes(h)),
        h,
      ).toBe(true);
    // A hash broken by the layout showed as "5305584913-" at a line's end.
    expect(lines.filter((l) => /\b[0-9a-f]{6,}-$/.test(l.trimEnd()))).toEqual([]);
  });

  it("gives each record type its own signature wording: the change request's “Verified” is not a test run's statement", () => {
    const flat = inOrder;
    expect(pack.signatures.map((x) => x.meaning)).toContain("verified");
    // The change request's verification affirms the change was implemented as approved.
    expect(flat).toContain(
      "I have checked that this change was implemented as approved and that its requalification evidence meets the requirements.",
    );
    expect(flat).toContain("I approve this change for implementation as assessed.");
    // The test run's wording appears only beside the runs' own signatures (section 6), once per verified run.
    const runVerified = pack.evidence
      .flatMap((r) => r.signatures)
      .filter((x) => x.meaning === "verified").length;
    expect(
      flat.split(
        "I have checked the recorded data and evidence of this test against its requirements.",
      ).length - 1,
    ).toBe(runVerified);
  });
});
