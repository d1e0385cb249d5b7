import { spawn } from "node:child_process";
import { CreateBucketCommand, S3Client } from "@aws-sdk/client-s3";
import S3rver from "s3rver";
import {
  cpSync,
  existsSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "@/db/client";
import { seedDemo } from "@/db/seed";
import { evidenceFiles, partFamilies, recipes, recipeVersions, users } from "@/db/schema";
import { sha256Hex, verifyAuditChain } from "@/lib/audit";
import { backup } from "@/lib/backup/backup";
import { manifestSchema, sha256File, type Manifest } from "@/lib/backup/manifest";
import { restore } from "@/lib/backup/restore";
import { gravimetricSampleSchema } from "@/lib/schemas/evidence";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { storeEvidenceFile } from "@/lib/server/evidence/store-file";
import { blobKey, localStore, s3Store, setStore } from "@/lib/storage";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const dir = mkdtempSync(join(tmpdir(), "washproof-backup-"));
const uploads = join(dir, "uploads");
let backupDir = "";
let manifest: Manifest;
let runId = "";
let tech: { id: string; name: string };
const stored: { sha256: string; sizeBytes: number }[] = [];

/** Lab files as a technician uploads them: a PDF report, a filter photo and an instrument CSV. */
const FILES: [string, Uint8Array][] = [
  [
    "Gravimetric report VB.pdf",
    new TextEncoder().encode("%PDF-1.4\n% gravimetric report, valve body lot 26-114\n%%EOF\n"),
  ],
  [
    "Filter after extraction.png",
    new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 7, 7, 7, 7]),
  ],
  ["Balance export.csv", new TextEncoder().encode("sample,before_mg,after_mg\nG-1,100.2,100.9\n")],
];

/** Runs one of the npm scripts as an operator would, against the given environment. */
function npmScript(script: "backup" | "restore", args: string[], env: Record<string, string>) {
  return new Promise<{ code: number | null; out: string }>((resolve) => {
    const child = spawn("npx", ["tsx", `scripts/${script}.ts`, ...args], {
      env: { ...process.env, NODE_ENV: "production", STORAGE_DRIVER: "local", ...env },
      stdio: ["ignore", "pipe", "pipe"],
    });
    let out = "";
    child.stdout.on("data", (c) => (out += c));
    child.stderr.on("data", (c) => (out += c));
    child.on("exit", (code) => resolve({ code, out }));
  });
}

const sample = (label: string) =>
  gravimetricSampleSchema.parse({
    sampleLabel: label,
    worstCase: "",
    components: "5",
    filterBeforeMg: "100.2",
    filterAfterMg: "100.7",
  });

beforeAll(async () => {
  t = await createTestDatabase();
  setStore(localStore(uploads));
  await seedDemo(t.db);
  const byEmail = async (email: string) =>
    (
      await t.db
        .select({ id: users.id, name: users.name })
        .from(users)
        .where(eq(users.email, email))
    )[0];
  tech = await byEmail("technician@fennmoor.example");
  const engineer = await byEmail("engineer@fennmoor.example");
  const [family] = await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
  // The valve body's own recipe: a run opens only on a qualified combination.
  const [{ version }] = await t.db
    .select({ version: recipeVersions })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
  runId = (
    await createRun(engineer, {
      partFamilyId: family.id,
      recipeVersionId: version.id,
      testType: "gravimetric",
      technicianId: tech.id,
      lab: "Larchfield lab",
      performedOn: "2026-03-02",
    })
  ).id;
  for (const [name, bytes] of FILES) {
    await storeEvidenceFile(tech, { runId, name, bytes, kind: "lab_report" });
    stored.push({ sha256: sha256Hex(bytes), sizeBytes: bytes.byteLength });
  }
});
afterAll(() => {
  setStore(undefined);
  t.cleanup();
  rmSync(dir, { recursive: true, force: true });
});

/** Every evidence file a database refers to, read back from a store folder and re-hashed. */
async function checkFiles(databaseUrl: string, uploadDir: string) {
  const restored = openDatabase(databaseUrl);
  try {
    const rows = await restored.db.select().from(evidenceFiles);
    for (const row of rows) {
      const bytes = readFileSync(join(uploadDir, blobKey(row.sha256)));
      expect(sha256Hex(bytes), row.originalName).toBe(row.sha256);
      expect(bytes.byteLength).toBe(row.sizeBytes);
    }
    return {
      files: rows.length,
      chain: await verifyAuditChain(restored.db),
      integrity: (await restored.client.execute("PRAGMA integrity_check")).rows[0]?.integrity_check,
    };
  } finally {
    restored.client.close();
  }
}

describe("npm run backup", () => {
  it("copies the database and every evidence file while results and files are still being written", async () => {
    let writing = true;
    let writes = 0;
    const writer = (async () => {
      for (let i = 0; writing; i++) {
        await addSample(tech, { runId, sample: sample(`W-${i}`) });
        await storeEvidenceFile(tech, {
          runId,
          name: `Balance export ${i}.csv`,
          bytes: new TextEncoder().encode(`sample,mg\nW-${i},${i}\n`),
          kind: "lab_report",
        });
        writes += 2;
      }
    })();
    const run = await npmScript("backup", ["--out", join(dir, "backups")], {
      DATABASE_URL: t.url,
      UPLOAD_DIR: uploads,
    });
    writing = false;
    await writer;
    expect(run.code, run.out).toBe(0);
    expect(writes, "writes went on during the backup").toBeGreaterThan(0);
    const [folder] = readdirSync(join(dir, "backups"));
    expect(folder).toMatch(/^washproof-\d{8}T\d{6}Z$/);
    backupDir = join(dir, "backups", folder);
    expect(run.out).toContain(`Backup written to ${backupDir}`);
    manifest = manifestSchema.parse(
      JSON.parse(readFileSync(join(backupDir, "manifest.json"), "utf8")),
    );
    expect(manifest.database.sha256).toBe(await sha256File(join(backupDir, "washproof.db")));
    expect(manifest.uploads).toEqual(expect.arrayContaining(stored));
    // The snapshot is one moment: the files it lists are exactly the ones its database refers to.
    const copy = await checkFiles(
      `file:${join(backupDir, "washproof.db")}`,
      join(backupDir, "uploads"),
    );
    expect(copy).toMatchObject({
      integrity: "ok",
      chain: { ok: true, events: manifest.database.auditEvents },
    });
    expect(new Set(manifest.uploads.map((u) => u.sha256)).size).toBe(manifest.uploads.length);
  });

  it("refuses a bad argument with the usage line", async () => {
    const run = await npmScript("backup", ["--to", "x"], {
      DATABASE_URL: t.url,
      UPLOAD_DIR: uploads,
    });
    expect(run.code).toBe(2);
    expect(run.out).toMatch(/Usage: npm run backup -- \[--out <folder>\]/);
  });
});

describe("npm run restore", () => {
  const fresh = join(dir, "fresh");
  const env = {
    DATABASE_URL: `file:${join(fresh, "washproof.db")}`,
    UPLOAD_DIR: join(fresh, "uploads"),
  };

  it("brings the backup back into a fresh location with its audit chain and every file hash intact", async () => {
    const run = await npmScript("restore", [backupDir], env);
    expect(run.code, run.out).toBe(0);
    expect(run.out).toMatch(/chain verified/);
    const restored = await checkFiles(env.DATABASE_URL, env.UPLOAD_DIR);
    expect(restored).toMatchObject({
      integrity: "ok",
      chain: {
        ok: true,
        events: manifest.database.auditEvents,
        lastHash: manifest.database.auditHead,
      },
    });
    expect(restored.files).toBeGreaterThanOrEqual(FILES.length);
    for (const file of stored)
      expect(existsSync(join(env.UPLOAD_DIR, blobKey(file.sha256)))).toBe(true);
  });

  it("refuses to replace an existing database without --replace, and keeps the old one aside with it", async () => {
    const before = await sha256File(join(fresh, "washproof.db"));
    const refused = await npmScript("restore", [backupDir], env);
    expect(refused.code).toBe(1);
    expect(refused.out).toMatch(
      /washproof\.db exists\. Stop the server, then run again with --replace/,
    );
    expect(await sha256File(join(fresh, "washproof.db"))).toBe(before);
    const replaced = await restore({
      folder: backupDir,
      databaseUrl: env.DATABASE_URL,
      store: localStore(env.UPLOAD_DIR),
      replace: true,
    });
    expect(replaced.keptAs).toMatch(/washproof\.db\.replaced-/);
    expect(await sha256File(replaced.keptAs!)).toBe(before);
  });

  it("refuses a tampered backup before touching anything", async () => {
    const target = {
      databaseUrl: `file:${join(dir, "untouched", "washproof.db")}`,
      store: localStore(join(dir, "untouched", "uploads")),
      replace: false,
    };
    const tampered = join(dir, "tampered");
    cpSync(backupDir, tampered, { recursive: true });
    const photo = join(tampered, "uploads", blobKey(stored[1].sha256));
    const bytes = readFileSync(photo);
    bytes[bytes.length - 1] ^= 1;
    writeFileSync(photo, bytes);
    await expect(restore({ folder: tampered, ...target })).rejects.toThrow(
      `Evidence file ${stored[1].sha256} in the backup does not match its hash`,
    );

    cpSync(backupDir, tampered, { recursive: true });
    const db = readFileSync(join(tampered, "washproof.db"));
    db[db.length - 100] ^= 1;
    writeFileSync(join(tampered, "washproof.db"), db);
    await expect(restore({ folder: tampered, ...target })).rejects.toThrow(
      /database file does not match the SHA-256 in its manifest/,
    );
    expect(existsSync(join(dir, "untouched"))).toBe(false);
  });
});

describe("with evidence in S3-compatible storage", () => {
  it("copies the files out of one bucket and restores them into another through the same store interface", async () => {
    const server = new S3rver({
      port: 0,
      address: "127.0.0.1",
      silent: true,
      directory: join(dir, "s3"),
    });
    const { port } = await server.run();
    try {
      const options = {
        endpoint: `http://127.0.0.1:${port}`,
        region: "us-east-1",
        forcePathStyle: true,
        accessKeyId: "S3RVER",
        secretAccessKey: "S3RVER",
      };
      const client = new S3Client({
        ...options,
        credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
      });
      for (const bucket of ["plant-evidence", "restored-evidence"])
        await client.send(new CreateBucketCommand({ Bucket: bucket }));
      const source = s3Store({ bucket: "plant-evidence", ...options });
      // The plant's evidence as it would be with STORAGE_DRIVER=s3: every file the live database refers to.
      const rows = await t.db.selectDistinct({ sha256: evidenceFiles.sha256 }).from(evidenceFiles);
      for (const { sha256 } of rows)
        await source.put(sha256, (await localStore(uploads).get(sha256))!);

      const made = await backup({
        databaseUrl: t.url,
        store: source,
        outDir: join(dir, "s3-backups"),
      });
      const target = s3Store({ bucket: "restored-evidence", ...options });
      await restore({
        folder: made.dir,
        databaseUrl: `file:${join(dir, "s3-restored", "washproof.db")}`,
        store: target,
        replace: false,
      });
      for (const file of made.manifest.uploads)
        expect(sha256Hex((await target.get(file.sha256))!)).toBe(file.sha256);
      expect(made.manifest.uploads.map((u) => u.sha256).sort()).toEqual(
        rows.map((r) => r.sha256).sort(),
      );
    } finally {
      await server.close();
    }
  });
});
