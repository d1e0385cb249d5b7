import { asc, eq } from "drizzle-orm";
import { appendAudit, canonicalJson, sha256Hex, SYSTEM_ACTOR } from "@/lib/audit";
import { asOf } from "@/lib/audit/seed-stamp";
import { computeRunOutcome } from "@/lib/evidence/outcome";
import { runContentHash } from "@/lib/evidence/run-hash";
import { changeContentHash, narrativeDocument } from "@/lib/changes/content";
import { assess } from "@/lib/changes/assess";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import { DEFAULT_MATRIX, matrixRowLine } from "@/lib/changes/requalification";
import { qualifyCombinationIn } from "@/lib/server/plant/qualify-combination";
import { getStore } from "@/lib/storage";
import type { Tx } from "./client";
import { loadRecipeSnapshot, writeRecipeContent } from "./recipe-content";
import { demoPhoto } from "./demo-photo";
import { DEMO_USERS } from "./seed-data";
import {
  changeRequestAssessments,
  changeRequests,
  changeRequestTests,
  cleanlinessSpecs,
  documents,
  documentVersions,
  evidenceFiles,
  partFamilies,
  recipeVersions,
  requalificationIntervals,
  requalificationMatrices,
  requalificationMatrixRows,
  signatures,
  testSamples,
  testRuns,
  type SignatureMeaning,
} from "./schema";
import { formatDate } from "@/lib/format/date";

interface Ids {
  userIds: Map<string, string>;
  recipeIds: Map<string, string>;
  familyIds: Map<string, string>;
}

type Person = { id: string; name: string };

/**
 * The invented change-control history of the demo: the requalification matrix,
 * a closed minor change (valve-body wash temperature inside its range), a closed
 * major change with its requalification evidence (fitting drying temperature above
 * its range), and an open major change waiting for evidence (pump-housing injection
 * pressure above its range). Intervals are set relative to today so that one
 * requalification is due within the month.
 */
export async function seedChangeControl(tx: Tx, ids: Ids, now = new Date()) {
  const audit = (input: Parameters<typeof appendAudit>[2]) => appendAudit(tx, SYSTEM_ACTOR, input);
  const person = (email: string): Person => ({
    id: ids.userIds.get(email)!,
    name: DEMO_USERS.find((u) => u.email === email)!.name,
  });
  const engineer = person("engineer@fennmoor.example");
  const approver = person("approver@fennmoor.example");
  const reviewer = person("reviewer@fennmoor.example");
  const technician = person("technician@fennmoor.example");
  if (!engineer.id || !approver.id || !reviewer.id || !technician.id) return;

  const [matrix] = await tx
    .insert(requalificationMatrices)
    .values({
      version: 1,
      status: "effective",
      note: "First matrix: each kind of change with the tests that requalify it, at 95 % confidence and 90 % reliability.",
      createdAt: "2025-02-20T09:00:00.000Z",
    })
    .returning();
  await tx
    .insert(requalificationMatrixRows)
    .values(DEFAULT_MATRIX.map((r) => ({ ...r, matrixId: matrix.id })));
  await asOf("2025-02-20T09:00:00.000Z", engineer, () =>
    audit({
      eventType: "requalification_matrix.versioned",
      recordType: "requalification_matrix",
      recordId: matrix.id,
      new: { version: 1, added: DEFAULT_MATRIX.map(matrixRowLine), rows: DEFAULT_MATRIX.length },
    }),
  );

  const versionsOf = async (code: string) =>
    tx
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.recipeId, ids.recipeIds.get(code)!));
  const sign = async (
    recordType: "change_request" | "test_run",
    recordId: string,
    signer: Person,
    meaning: SignatureMeaning,
    contentHash: string,
    signedAt: string,
  ) => {
    const [row] = await tx
      .insert(signatures)
      .values({
        recordType,
        recordId,
        userId: signer.id,
        printedName: signer.name,
        meaning,
        signedAt,
        contentHash,
      })
      .returning();
    await asOf(signedAt, null, () =>
      appendAudit(tx, signer, {
        eventType: "signature.applied",
        recordType: "signature",
        recordId: row.id,
        new: {
          on: `${recordType}:${recordId}`,
          meaning,
          printedName: signer.name,
          contentHash,
          signedAt,
        },
      }),
    );
  };

  async function change(input: {
    number: string;
    title: string;
    recipe: string;
    fromId: string;
    toId: string;
    narrative: string;
    status: "closed" | "requalification";
    openedAt: string;
    steps: { meaning: SignatureMeaning; by: Person; at: string }[];
    closedAt?: string;
  }) {
    const [from, to] = [
      await loadRecipeSnapshot(tx, input.fromId),
      await loadRecipeSnapshot(tx, input.toId),
    ];
    const result = assess({
      from,
      to,
      newPartFamily: null,
      raisedTo: null,
      matrix: DEFAULT_MATRIX,
    });
    const content = narrativeDocument(input.narrative);
    const [doc] = await tx
      .insert(documents)
      .values({
        number: `CN-${input.number.slice(3)}`,
        title: `Justification and risk assessment, ${input.number}`,
        type: "change_narrative",
        recipeVersionId: input.toId,
        ownerId: engineer.id,
        createdAt: input.openedAt,
      })
      .returning();
    // The narrative follows its change: approved while requalifying, effective once closed.
    await tx.insert(documentVersions).values({
      documentId: doc.id,
      version: 1,
      status: input.status === "closed" ? "effective" : "approved",
      content,
      contentHash: sha256Hex(canonicalJson(content)),
      effectiveDate: input.closedAt ? formatDate(input.closedAt) : null,
      createdBy: engineer.id,
      createdAt: input.openedAt,
    });
    const [cr] = await tx
      .insert(changeRequests)
      .values({
        number: input.number,
        title: input.title,
        recipeId: ids.recipeIds.get(input.recipe)!,
        fromVersionId: input.fromId,
        toVersionId: input.toId,
        status: input.status,
        impact: result.impact,
        impactDetails: {
          computed: result.computed,
          raisedTo: null,
          raiseReason: null,
          matrixVersion: 1,
          diff: result.diff,
          triggers: result.triggers,
          tests: result.tests,
        },
        narrativeDocumentId: doc.id,
        createdBy: engineer.id,
        createdAt: input.openedAt,
        closedAt: input.closedAt ?? null,
      })
      .returning();
    const tests = [];
    for (const t of result.tests) {
      const [row] = await tx
        .insert(changeRequestTests)
        .values({
          changeRequestId: cr.id,
          testType: t.testType,
          samples: t.samples,
          confidencePct: t.confidencePct,
          reliabilityPct: t.reliabilityPct,
          because: t.because,
        })
        .returning();
      tests.push(row);
    }
    const hash = changeContentHash({
      number: cr.number,
      title: cr.title,
      kind: "parameter_change",
      partFamilyId: null,
      fromVersionId: input.fromId,
      proposal: to,
      narrative: content,
      impact: result.impact,
      raiseReason: null,
      requirements: result.tests.map((t) => ({ testType: t.testType, samples: t.samples })),
    });
    await tx.insert(changeRequestAssessments).values({
      changeRequestId: cr.id,
      kind: "parameter_change",
      computedImpact: result.computed,
      matrixId: matrix.id,
      contentHash: hash,
      updatedAt: input.openedAt,
    });
    // Each step is recorded at the time its signature says, as the people did it.
    const stepAt = (meaning: SignatureMeaning) =>
      input.steps.find((s) => s.meaning === meaning)?.at ?? input.openedAt;
    const versionNo = async (versionId: string) =>
      (
        await tx
          .select({ version: recipeVersions.version })
          .from(recipeVersions)
          .where(eq(recipeVersions.id, versionId))
      )[0].version;
    const [fromVersion, toVersion] = [await versionNo(input.fromId), await versionNo(input.toId)];
    await asOf(input.openedAt, engineer, () =>
      audit({
        eventType: "change.opened",
        recordType: "change_request",
        recordId: cr.id,
        new: {
          number: cr.number,
          title: cr.title,
          kind: "parameter_change",
          recipe: input.recipe,
          fromVersion,
          toVersion,
          narrativeDocument: doc.number,
        },
      }),
    );
    for (const s of input.steps)
      await sign("change_request", `${cr.id}#1`, s.by, s.meaning, hash, s.at);
    await asOf(stepAt("authored"), engineer, () =>
      audit({
        eventType: "change.impact_assessed",
        recordType: "change_request",
        recordId: cr.id,
        old: { status: "draft" },
        new: {
          status: "impact_assessed",
          impact: result.impact,
          computed: result.computed,
          matrixVersion: 1,
          tests: result.tests.map((t) => `${t.testType} × ${t.samples}`),
          contentHash: hash,
        },
      }),
    );
    await asOf(stepAt("approved"), approver, () =>
      audit({
        eventType: "change.approved",
        recordType: "change_request",
        recordId: cr.id,
        old: { status: "impact_assessed" },
        new: { status: "approved_for_implementation", impact: result.impact },
      }),
    );
    return { cr, tests, result };
  }

  // ── A closed minor change: the valve body's v1 → v2 already in the recipe history.
  const vb = (await versionsOf("R-AW3-VB")).sort((a, b) => a.version - b.version);
  const minor = await change({
    number: "CR-2025-001",
    title: "Raise valve-body wash temperature to 60 °C",
    recipe: "R-AW3-VB",
    fromId: vb[0].id,
    toId: vb[1].id,
    narrative:
      "Heavier cutting-fluid carry-over from the new machining line leaves a film in the cross bores. Raising the bath from 55 °C to 60 °C keeps the setpoint inside the validated range of 50–65 °C proven in the PQ.\n\nRisk: none beyond the range already proven; the bath stays below the detergent's upper working temperature. Operators are reminded of the burn hazard at the tank.",
    status: "closed",
    openedAt: "2025-08-12T08:30:00.000Z",
    closedAt: "2025-09-01T07:00:00.000Z",
    steps: [
      { meaning: "authored", by: engineer, at: "2025-08-12T09:10:00.000Z" },
      { meaning: "approved", by: approver, at: "2025-08-14T13:45:00.000Z" },
      { meaning: "verified", by: reviewer, at: "2025-08-29T10:20:00.000Z" },
    ],
  });
  await asOf("2025-09-01T07:00:00.000Z", approver, () =>
    audit({
      eventType: "change.closed",
      recordType: "change_request",
      recordId: minor.cr.id,
      old: { status: "verified" },
      new: { status: "closed", effectiveVersion: 2 },
    }),
  );

  // ── A closed major change with requalification evidence: fitting drying temperature above its range.
  const [sf1] = await versionsOf("R-SC1-SF");
  const sfContent = await loadRecipeSnapshot(tx, sf1.id);
  const sfNext: RecipeSnapshot = {
    ...sfContent,
    notes: "Drying temperature raised to 105 °C; range revalidated at 95–110 °C.",
    stages: sfContent.stages.map((s) => ({
      ...s,
      parameters: s.parameters.map((p) =>
        p.key === "drying.temperature"
          ? { ...p, setpoint: 105, validatedLow: 95, validatedHigh: 110 }
          : p,
      ),
    })),
  };
  const closedAt = "2026-06-15T07:00:00.000Z";
  const [sf2] = await tx
    .insert(recipeVersions)
    .values({
      recipeId: sf1.recipeId,
      version: 2,
      status: "proposed",
      createdBy: engineer.id,
      createdAt: "2026-04-20T08:00:00.000Z",
    })
    .returning();
  await writeRecipeContent(tx, sf2.id, sfNext);
  const major = await change({
    number: "CR-2026-001",
    title: "Dry fittings at 105 °C to clear water from the thread roots",
    recipe: "R-SC1-SF",
    fromId: sf1.id,
    toId: sf2.id,
    narrative:
      "Customer audit found residual water in the thread roots of SF-12 fittings after 15 min. Raising the hot-air drying temperature from 90 °C to 105 °C is outside the validated range of 80–100 °C, so the range is revalidated at 95–110 °C.\n\nRisk: hotter parts at unloading (burn), possible discolouration of stainless steel. Dryness and visual requalification on the worst-case basket positions.",
    status: "closed",
    openedAt: "2026-04-20T08:00:00.000Z",
    closedAt,
    steps: [
      { meaning: "authored", by: engineer, at: "2026-04-20T09:00:00.000Z" },
      { meaning: "approved", by: approver, at: "2026-04-22T11:30:00.000Z" },
      { meaning: "verified", by: reviewer, at: "2026-06-12T14:00:00.000Z" },
    ],
  });
  // The requalification runs, written as the evidence feature writes them: raw data in the entry
  // schema's shape, the lab report and a photo stored by SHA-256, the outcome computed from them,
  // and signatures bound to the run's content hash.
  const [fitting] = await tx
    .select({ family: partFamilies, spec: cleanlinessSpecs })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(eq(partFamilies.id, ids.familyIds.get("PF-SF-12")!));
  let runNo = 0;
  for (const req of major.tests) {
    runNo += 1;
    const number = `RQ-2026-${String(runNo).padStart(3, "0")}`;
    const seen =
      req.testType === "dryness"
        ? "no water in the thread roots 5 min after unloading"
        : "no stains or discolouration";
    const samples = Array.from({ length: req.samples }, (_, i) => ({
      sampleLabel: `SF-12-26-${String(i + 1).padStart(3, "0")}`,
      basketPosition: i % 5 === 0 ? "corner, bottom layer" : "centre",
      worstCase: i % 5 === 0,
      data: { acceptable: true, observation: seen },
    }));
    const [run] = await tx
      .insert(testRuns)
      .values({
        number,
        partFamilyId: fitting.family.id,
        specId: fitting.spec.id,
        recipeVersionId: sf2.id,
        changeRequestId: major.cr.id,
        testType: req.testType,
        status: "verified",
        outcome: "incomplete",
        technicianId: technician.id,
        lab: "Larchfield cleanliness lab",
        performedOn: "2026-06-08",
        createdBy: technician.id,
        createdAt: "2026-06-08T12:00:00.000Z",
      })
      .returning();
    await tx.insert(testSamples).values(
      samples.map((x, i) => ({
        ...x,
        runId: run.id,
        createdAt: `2026-06-08T12:${String(i).padStart(2, "0")}:00.000Z`,
      })),
    );
    await asOf("2026-06-08T12:00:00.000Z", null, () =>
      appendAudit(tx, technician, {
        eventType: "test_run.created",
        recordType: "test_run",
        recordId: run.id,
        new: {
          number,
          partFamilyId: run.partFamilyId,
          recipeVersionId: run.recipeVersionId,
          testType: run.testType,
          technicianId: technician.id,
          lab: "Larchfield cleanliness lab",
          performedOn: "2026-06-08",
          changeRequestId: major.cr.id,
        },
      }),
    );
    // The lab's report and one photo of the worst-case basket corner, as uploaded.
    const report = new TextEncoder().encode(
      [
        `Larchfield cleanliness lab,${number},${req.testType},PF-SF-12,R-SC1-SF v2,2026-06-08`,
        "sample,basket_position,worst_case,result",
        ...samples.map(
          (x) => `${x.sampleLabel},${x.basketPosition},${x.worstCase ? "yes" : "no"},${seen}`,
        ),
      ].join("\r\n") + "\r\n",
    );
    const uploads = [
      {
        bytes: report,
        originalName: `${number}-lab-report.csv`,
        mimeType: "text/csv",
        kind: "lab_report" as const,
        sampleLabel: null,
        uploadedAt: "2026-06-08T14:30:00.000Z",
      },
      {
        bytes: demoPhoto(runNo),
        originalName: `${number}-corner-basket.png`,
        mimeType: "image/png",
        kind: "photo" as const,
        sampleLabel: samples[0].sampleLabel,
        uploadedAt: "2026-06-08T14:35:00.000Z",
      },
    ];
    for (const { bytes, ...meta } of uploads) {
      const sha256 = sha256Hex(bytes);
      const { created } = await getStore().put(sha256, bytes);
      const [file] = await tx
        .insert(evidenceFiles)
        .values({
          ...meta,
          runId: run.id,
          sha256,
          sizeBytes: bytes.length,
          uploadedBy: technician.id,
        })
        .returning();
      await asOf(meta.uploadedAt, null, () =>
        appendAudit(tx, technician, {
          eventType: "evidence_file.uploaded",
          recordType: "evidence_file",
          recordId: file.id,
          new: {
            run: `${run.number} rev ${run.revision}`,
            runId: run.id,
            sha256,
            name: file.originalName,
            mimeType: file.mimeType,
            sizeBytes: bytes.length,
            kind: file.kind,
            storedNew: created,
          },
        }),
      );
    }
    const rows = await tx
      .select()
      .from(testSamples)
      .where(eq(testSamples.runId, run.id))
      .orderBy(asc(testSamples.createdAt), asc(testSamples.id));
    const files = await tx
      .select()
      .from(evidenceFiles)
      .where(eq(evidenceFiles.runId, run.id))
      .orderBy(asc(evidenceFiles.uploadedAt), asc(evidenceFiles.id));
    const { outcome } = computeRunOutcome({
      testType: req.testType,
      family: fitting.family,
      spec: fitting.spec,
      conductivityLimitUsPerCm: null,
      samples: rows,
      runData: null,
      photoCount: files.filter((f) => f.kind === "photo").length,
    });
    await tx.update(testRuns).set({ outcome }).where(eq(testRuns.id, run.id));
    const { hash: runHash } = runContentHash(run, rows, files);
    await sign("test_run", run.id, technician, "performed", runHash, "2026-06-08T15:00:00.000Z");
    await sign("test_run", run.id, engineer, "verified", runHash, "2026-06-10T09:00:00.000Z");
  }
  await tx
    .update(recipeVersions)
    .set({ status: "superseded", effectiveTo: closedAt })
    .where(eq(recipeVersions.id, sf1.id));
  await tx
    .update(recipeVersions)
    .set({ status: "effective", effectiveFrom: closedAt })
    .where(eq(recipeVersions.id, sf2.id));
  await asOf(closedAt, approver, () =>
    audit({
      eventType: "recipe_version.superseded",
      recordType: "recipe_version",
      recordId: sf1.id,
      old: { status: "effective" },
      new: { status: "superseded", effectiveTo: closedAt, by: 2, changeRequest: major.cr.number },
    }),
  );
  await asOf(closedAt, approver, () =>
    audit({
      eventType: "recipe_version.effective",
      recordType: "recipe_version",
      recordId: sf2.id,
      old: { status: "proposed" },
      new: { status: "effective", effectiveFrom: closedAt, changeRequest: major.cr.number },
    }),
  );
  await asOf(closedAt, approver, () =>
    audit({
      eventType: "change.closed",
      recordType: "change_request",
      recordId: major.cr.id,
      old: { status: "verified" },
      new: { status: "closed", effectiveVersion: 2 },
    }),
  );

  // ── An open major change waiting for evidence: pump-housing injection pressure above its range.
  const [ph1] = await versionsOf("R-AW3-PH");
  const phContent = await loadRecipeSnapshot(tx, ph1.id);
  const [ph2] = await tx
    .insert(recipeVersions)
    .values({
      recipeId: ph1.recipeId,
      version: 2,
      status: "proposed",
      createdBy: engineer.id,
      createdAt: "2026-11-16T08:00:00.000Z",
    })
    .returning();
  await writeRecipeContent(tx, ph2.id, {
    ...phContent,
    notes: "Injection pressure raised to 16 bar for the new deep cross bore.",
    stages: phContent.stages.map((s) => ({
      ...s,
      parameters: s.parameters.map((p) =>
        p.key === "wash.injection_pressure" ? { ...p, setpoint: 16 } : p,
      ),
    })),
  });
  const open = await change({
    number: "CR-2026-002",
    title: "Raise pump-housing injection pressure to 16 bar",
    recipe: "R-AW3-PH",
    fromId: ph1.id,
    toId: ph2.id,
    narrative:
      "The PH-400 revision C adds a 140 mm cross bore that the 12 bar injection does not flush clear of chips. 16 bar is above the validated range of 10–15 bar.\n\nRisk: higher spray pressure on the fixture seals and more mist at the chamber door. Particle cleanliness and gravimetric requalification, worst case at the new bore.",
    status: "requalification",
    openedAt: "2026-11-16T08:00:00.000Z",
    steps: [
      { meaning: "authored", by: engineer, at: "2026-11-16T09:00:00.000Z" },
      { meaning: "approved", by: approver, at: "2026-11-18T10:15:00.000Z" },
    ],
  });
  await asOf("2026-11-19T08:00:00.000Z", engineer, () =>
    audit({
      eventType: "change.requalification_started",
      recordType: "change_request",
      recordId: open.cr.id,
      old: { status: "approved_for_implementation" },
      new: { status: "requalification" },
    }),
  );

  // ── Validated combinations and their periodic requalification.
  const monthsAgo = (m: number, plusDays = 0) => {
    const d = new Date(now);
    d.setUTCMonth(d.getUTCMonth() - m);
    d.setUTCDate(d.getUTCDate() + plusDays);
    return d.toISOString();
  };
  const intervals = [
    {
      version: vb[1],
      partFamilyId: ids.familyIds.get("PF-VB-210")!,
      lastQualifiedAt: monthsAgo(12, 14),
      basis: "Carried over from v1 by CR-2025-001 (minor change); periodic requalification",
    },
    {
      version: ph1,
      partFamilyId: ids.familyIds.get("PF-PH-400")!,
      lastQualifiedAt: monthsAgo(5),
      basis: "Pump housing PQ and its periodic requalification",
    },
    {
      version: sf2,
      partFamilyId: ids.familyIds.get("PF-SF-12")!,
      lastQualifiedAt: closedAt,
      basis: "Requalified by CR-2026-001",
    },
  ];
  for (const { version, ...i } of intervals) {
    const [row] = await tx
      .insert(requalificationIntervals)
      .values({ ...i, recipeVersionId: version.id, intervalMonths: 12 })
      .returning();
    // The same values closing a change records for the first interval of a validated combination.
    await asOf(i.lastQualifiedAt, approver, () =>
      audit({
        eventType: "requalification_interval.set",
        recordType: "requalification_interval",
        recordId: row.id,
        new: {
          recipeVersion: version.version,
          partFamilyId: i.partFamilyId,
          intervalMonths: 12,
          lastQualifiedAt: i.lastQualifiedAt,
        },
      }),
    );
  }
  // The superseded versions the demo's older runs were made on were qualified in their day too.
  await asOf("2025-03-10T16:00:00.000Z", approver, () =>
    qualifyCombinationIn(tx, SYSTEM_ACTOR, {
      recipeVersionId: vb[0].id,
      partFamilyId: ids.familyIds.get("PF-VB-210")!,
      basis: "Valve body PQ (first validation)",
      qualifiedOn: "2025-03-10",
      intervalMonths: 12,
    }),
  );
  await asOf("2025-06-02T16:00:00.000Z", approver, () =>
    qualifyCombinationIn(tx, SYSTEM_ACTOR, {
      recipeVersionId: sf1.id,
      partFamilyId: ids.familyIds.get("PF-SF-12")!,
      basis: "Fitting PQ (first validation)",
      qualifiedOn: "2025-06-02",
      intervalMonths: 12,
    }),
  );
}
