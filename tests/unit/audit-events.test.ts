import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { appendAudit, canonicalJson, verifyAuditChain } from "@/lib/audit";
import { describeChanges } from "@/lib/audit/describe";
import {
  AUDIT_EVENT_TYPES,
  auditEventSchema,
  type AuditEventInput,
  type AuditEventType,
} from "@/lib/audit/events";
import { chainHash } from "@/lib/audit/hash";
import {
  currentEventType,
  LEGACY_EVENT_TYPES,
  readAuditEvent,
  storedNamesOf,
} from "@/lib/audit/read";
import { auditQuerySchema } from "@/lib/schemas/audit";
import { auditFilterOptions, queryAuditEvents } from "@/lib/server/audit/query-audit-events";
import { createTestDatabase } from "./support/test-db";

const H = "ab".repeat(32); // a SHA-256 in hex
const H2 = "cd".repeat(32);
const AT = "2026-11-20T09:30:00.000Z";
const UUID = "5b0c1f0e-2d4a-4c8e-9a51-0d3f6b7c8e90";

/**
 * One payload per event type, shaped as the service that writes it writes it
 * (the file is named beside each). The `satisfies` makes the compiler check
 * every sample against its own type, and the tests below check it at run time.
 */
const SAMPLES = {
  // lib/server/auth/sign-in.ts
  "auth.signed_in": { eventType: "auth.signed_in", recordType: "user", recordId: UUID },
  // app/(app)/actions.ts
  "auth.signed_out": { eventType: "auth.signed_out", recordType: "user", recordId: UUID },
  "auth.sign_in_failed": {
    eventType: "auth.sign_in_failed",
    recordType: "user",
    recordId: UUID,
    new: { reason: "wrong password", during: "signing" },
  },
  "auth.locked_out": {
    eventType: "auth.locked_out",
    recordType: "user",
    recordId: UUID,
    new: { lockedUntil: AT, attempts: 5 },
  },
  // lib/server/users/change-password.ts
  "auth.password_changed": {
    eventType: "auth.password_changed",
    recordType: "user",
    recordId: UUID,
  },
  // lib/server/users/*.ts
  "user.created": {
    eventType: "user.created",
    recordType: "user",
    recordId: UUID,
    new: {
      name: "Ada Brook",
      email: "ada@example.test",
      jobTitle: null,
      roles: ["auditor", "engineer"],
    },
  },
  "user.updated": {
    eventType: "user.updated",
    recordType: "user",
    recordId: UUID,
    old: { jobTitle: null },
    new: { jobTitle: "Process engineer" },
  },
  "user.roles_changed": {
    eventType: "user.roles_changed",
    recordType: "user",
    recordId: UUID,
    old: { roles: ["engineer"] },
    new: { roles: ["auditor", "engineer"] },
  },
  "user.deactivated": {
    eventType: "user.deactivated",
    recordType: "user",
    recordId: UUID,
    old: { active: true },
    new: { active: false },
    reason: "Left the company",
  },
  "user.reactivated": {
    eventType: "user.reactivated",
    recordType: "user",
    recordId: UUID,
    old: { active: false },
    new: { active: true },
    reason: "Back from leave",
  },
  "user.password_reset": {
    eventType: "user.password_reset",
    recordType: "user",
    recordId: UUID,
    new: { mustChangePassword: true },
  },
  // db/seed.ts (sites, specs, part families and recipes are created by the seed only)
  // lib/server/plant/*.ts and lib/server/systems/*.ts
  "company.set_up": {
    eventType: "company.set_up",
    recordType: "company",
    recordId: "company",
    new: { companyName: "Example Components" },
  },
  "cleaning_system.retired": {
    eventType: "cleaning_system.retired",
    recordType: "cleaning_system",
    recordId: UUID,
    old: { active: true },
    new: { active: false, retiredAt: "2026-12-02T10:00:00.000Z" },
    reason: "Replaced by the new line",
  },
  "cleanliness_spec.revised": {
    eventType: "cleanliness_spec.revised",
    recordType: "cleanliness_spec",
    recordId: UUID,
    old: {
      code: "CS-VB",
      name: "Valve body grade 2",
      customer: "Customer A",
      documentNumber: "QS-114",
      revision: "C",
      sourceFileId: null,
      ccc: "A(B-D20/EF14/G-H11/I-J7/K-N00)",
      maxMetallicUm: 400,
      maxNonMetallicUm: 600,
      maxFibreUm: 1000,
      gravimetricLimitMg: 1.5,
      gravimetricBasis: "per_component" as const,
      minWettingTensionMNm: 36,
      visualCriteria: null,
      drynessCriteria: null,
      extraRequirements: null,
      customerApprovesChanges: true,
    },
    new: {
      ...{
        code: "CS-VB",
        name: "Valve body grade 2",
        customer: "Customer A",
        documentNumber: "QS-114",
        revision: "C",
        sourceFileId: null,
        ccc: "A(B-D20/EF14/G-H11/I-J7/K-N00)",
        maxMetallicUm: 400,
        maxNonMetallicUm: 600,
        maxFibreUm: 1000,
        gravimetricLimitMg: 1.5,
        gravimetricBasis: "per_component" as const,
        minWettingTensionMNm: 36,
        visualCriteria: null,
        drynessCriteria: null,
        extraRequirements: null,
        customerApprovesChanges: true,
      },
      revision: "D",
    },
    reason: "Customer tightened the fibre limit",
  },
  "cleanliness_spec.superseded": {
    eventType: "cleanliness_spec.superseded",
    recordType: "cleanliness_spec",
    recordId: UUID,
    old: { status: "in_force" },
    new: { status: "superseded", by: "CS-VB rev D" },
    reason: "Revision D",
  },
  "part_family.updated": {
    eventType: "part_family.updated",
    recordType: "part_family",
    recordId: UUID,
    old: { specification: "CS-VB rev C" },
    new: { specification: "CS-VB rev D" },
    reason: "Revision D",
  },
  "combination.qualified": {
    eventType: "combination.qualified",
    recordType: "requalification_interval",
    recordId: UUID,
    new: {
      combination: "R-AW3-VB v2 × PF-VB",
      basis: "Valve body PQ",
      qualifiedOn: "2025-03-10",
      intervalMonths: 12,
    },
  },
  "site.created": {
    eventType: "site.created",
    recordType: "site",
    recordId: UUID,
    new: { name: "Plant", location: null },
  },
  "cleaning_system.created": {
    eventType: "cleaning_system.created",
    recordType: "cleaning_system",
    recordId: UUID,
    new: { code: "AW-3", name: "Washer", stages: ["Tank 1", "Dryer"] },
  },
  // lib/server/systems/update-system.ts
  "cleaning_system.updated": {
    eventType: "cleaning_system.updated",
    recordType: "cleaning_system",
    recordId: UUID,
    old: { name: "Washer", description: null, stages: ["Tank 1 (wash; spray; 900 L)"] },
    new: {
      name: "Washer",
      description: "Three tanks",
      stages: ["Tank 1 (wash; spray, flood; 900 L)"],
    },
  },
  "cleanliness_spec.created": {
    eventType: "cleanliness_spec.created",
    recordType: "cleanliness_spec",
    recordId: UUID,
    new: {
      code: "CS-1",
      name: "Spec",
      ccc: "A(B-D18)",
      gravimetricLimitMg: 2,
      gravimetricBasis: "per_component",
    },
  },
  "part_family.created": {
    eventType: "part_family.created",
    recordType: "part_family",
    recordId: UUID,
    new: {
      code: "PF-1",
      name: "Valve body",
      material: "Aluminium",
      wettedAreaCm2: 420,
      wettedVolumeCm3: 35,
      spec: "CS-1",
    },
  },
  "recipe.created": {
    eventType: "recipe.created",
    recordType: "recipe",
    recordId: UUID,
    new: { code: "R-1", name: "Valve bodies" },
  },
  "recipe_version.created": {
    eventType: "recipe_version.created",
    recordType: "recipe_version",
    recordId: UUID,
    new: { recipe: "R-1", version: 1, notes: "First validated version." },
  },
  // lib/server/changes/open-change-request.ts, close-change.ts, end-change.ts
  "recipe_version.proposed": {
    eventType: "recipe_version.proposed",
    recordType: "recipe_version",
    recordId: UUID,
    new: { recipe: "R-1", version: 3, copiedFrom: 2, changeRequest: "CR-2026-004" },
  },
  "recipe_version.effective": {
    eventType: "recipe_version.effective",
    recordType: "recipe_version",
    recordId: UUID,
    old: { status: "proposed" },
    new: { status: "effective", effectiveFrom: AT, changeRequest: "CR-2026-004" },
  },
  "recipe_version.superseded": {
    eventType: "recipe_version.superseded",
    recordType: "recipe_version",
    recordId: UUID,
    old: { status: "effective" },
    new: { status: "superseded", effectiveTo: AT, by: 3, changeRequest: "CR-2026-004" },
  },
  // lib/server/changes/open-initial-validation.ts, end-change.ts
  "recipe_version.validation_opened": {
    eventType: "recipe_version.validation_opened",
    recordType: "recipe_version",
    recordId: UUID,
    old: { status: "draft" },
    new: { status: "proposed", changeRequest: "CR-2026-005", partFamily: "PF-NEW-1" },
  },
  "recipe_version.returned_to_draft": {
    eventType: "recipe_version.returned_to_draft",
    recordType: "recipe_version",
    recordId: UUID,
    old: { status: "proposed" },
    new: { status: "draft", changeRequest: "CR-2026-005" },
    reason: "Range to be narrowed first",
  },
  "recipe_version.withdrawn": {
    eventType: "recipe_version.withdrawn",
    recordType: "recipe_version",
    recordId: UUID,
    old: { status: "proposed" },
    new: { status: "withdrawn", changeRequest: "CR-2026-004" },
    reason: "Not needed",
  },
  // lib/server/signatures/apply-signature.ts
  "signature.applied": {
    eventType: "signature.applied",
    recordType: "signature",
    recordId: UUID,
    new: {
      on: `test_run:${UUID}`,
      meaning: "performed",
      printedName: "Ada Brook",
      contentHash: H,
      signedAt: AT,
    },
  },
  // lib/server/email/send-test-email.ts
  "email.test_sent": {
    eventType: "email.test_sent",
    recordType: "email",
    recordId: UUID,
    new: { to: "qa@example.test" },
  },
  // app/api/audit-events/export/route.ts, app/(app)/trace/audit/actions.ts
  "audit.exported": {
    eventType: "audit.exported",
    recordType: "audit_trail",
    recordId: "csv",
    new: { filters: { eventType: "change.closed", from: "2026-01-01" } },
  },
  "audit.verified": {
    eventType: "audit.verified",
    recordType: "audit_trail",
    recordId: "chain",
    new: { ok: false, brokenAt: 12, reason: "event 12 was altered after it was written" },
  },
  // lib/server/audit/write-checkpoint.ts
  "audit.checkpointed": {
    eventType: "audit.checkpointed",
    recordType: "audit_trail",
    recordId: "chain",
    new: {
      seq: 42,
      hash: "a".repeat(64),
      at: "2026-12-02T10:00:00.000Z",
      keyId: "k-1f2e",
      signature: "c2lnbmF0dXJl",
      emailedTo: null,
      mailId: null,
    },
  },
  // lib/server/documents/*.ts
  "document.created": {
    eventType: "document.created",
    recordType: "document",
    recordId: UUID,
    new: {
      number: "OQ-AW3-0002",
      title: "OQ",
      type: "oq_protocol",
      system: "AW-3",
      partFamily: null,
      recipeVersion: "R-1 v2",
      versionId: UUID,
      sampleSize: 22,
    },
  },
  "document.edited": {
    eventType: "document.edited",
    recordType: "document_version",
    recordId: UUID,
    old: { contentHash: H, lockVersion: 3 },
    new: { contentHash: H2, lockVersion: 4, savedOverNewer: true },
  },
  "document.submitted": {
    eventType: "document.submitted",
    recordType: "document_version",
    recordId: UUID,
    old: { status: "draft" },
    new: {
      status: "in_review",
      number: "OQ-AW3-0002",
      version: 1,
      contentHash: H,
      round: 1,
      routing: "sequence",
      reviewers: [UUID],
      approver: UUID,
      due: AT,
    },
  },
  "document.reviewed": {
    eventType: "document.reviewed",
    recordType: "document_version",
    recordId: UUID,
    new: { step: 1, round: 1, contentHash: H, nextStep: "approver" },
  },
  "document.sent_back": {
    eventType: "document.sent_back",
    recordType: "document_version",
    recordId: UUID,
    old: { status: "in_review", contentHash: H },
    new: { status: "draft", round: 1 },
    reason: "Add the drying time",
  },
  "document.rejected": {
    eventType: "document.rejected",
    recordType: "document_version",
    recordId: UUID,
    old: { status: "in_review", contentHash: null },
    new: { status: "draft", round: 2 },
    reason: "Wrong washer",
  },
  "document.approved": {
    eventType: "document.approved",
    recordType: "document_version",
    recordId: UUID,
    old: { status: "in_review" },
    new: { status: "approved", contentHash: H, effectiveDate: "2026-12-01" },
  },
  "document.effective": {
    eventType: "document.effective",
    recordType: "document_version",
    recordId: UUID,
    old: { status: "approved" },
    new: { status: "effective", effectiveDate: "2026-12-01", version: 2 },
  },
  "document.superseded": {
    eventType: "document.superseded",
    recordType: "document_version",
    recordId: UUID,
    old: { status: "effective", version: 1 },
    new: { status: "superseded", byVersion: 2 },
  },
  "document.retired": {
    eventType: "document.retired",
    recordType: "document_version",
    recordId: UUID,
    old: { status: "effective" },
    new: { status: "retired", version: 2 },
    reason: "Washer scrapped",
  },
  "document.version_started": {
    eventType: "document.version_started",
    recordType: "document_version",
    recordId: UUID,
    new: { version: 3, from: 2, contentHash: H },
    reason: "New rinse stage",
  },
  "document.review_overdue": {
    eventType: "document.review_overdue",
    recordType: "document_review",
    recordId: UUID,
    new: { assignee: UUID, due: AT, notifiedAt: AT },
  },
  "document.exported": {
    eventType: "document.exported",
    recordType: "document_version",
    recordId: UUID,
    new: {
      format: "pdf",
      number: "OQ-AW3-0002",
      version: 2,
      status: "effective",
      contentHash: H,
      bytes: 48213,
    },
  },
  // lib/server/evidence/*.ts
  "test_run.created": {
    eventType: "test_run.created",
    recordType: "test_run",
    recordId: UUID,
    new: {
      number: "TR-0042",
      partFamilyId: UUID,
      recipeVersionId: UUID,
      testType: "particle_cleanliness",
      technicianId: UUID,
      lab: "Larchfield lab",
      performedOn: "2026-11-20",
      changeRequestId: UUID,
    },
  },
  "test_run.sample_added": {
    eventType: "test_run.sample_added",
    recordType: "test_run",
    recordId: UUID,
    new: {
      sampleId: UUID,
      sampleLabel: "VB-26-001",
      basketPosition: null,
      worstCase: true,
      data: { counts: { B: 1200 } },
      outcome: "incomplete",
    },
  },
  "test_run.sample_removed": {
    eventType: "test_run.sample_removed",
    recordType: "test_run",
    recordId: UUID,
    old: { sampleId: UUID, sampleLabel: "VB-26-001", data: { counts: { B: 1200 } } },
    new: { outcome: "incomplete" },
  },
  "test_run.data_saved": {
    eventType: "test_run.data_saved",
    recordType: "test_run",
    recordId: UUID,
    old: { runData: null },
    new: { runData: { blankCounts: { B: 10 } }, outcome: "pass" },
  },
  "test_run.csv_imported": {
    eventType: "test_run.csv_imported",
    recordType: "test_run",
    recordId: UUID,
    new: {
      fileId: UUID,
      sha256: H,
      name: "lab.csv",
      rows: 10,
      samples: ["VB-1", "VB-2"],
      outcome: "pass",
    },
  },
  "test_run.performed": {
    eventType: "test_run.performed",
    recordType: "test_run",
    recordId: UUID,
    old: { status: "open" },
    new: { status: "performed", contentHash: H, outcome: "pass", code: "CCC = N(B14/C12)" },
  },
  "test_run.verified": {
    eventType: "test_run.verified",
    recordType: "test_run",
    recordId: UUID,
    old: { status: "performed" },
    new: { status: "verified", contentHash: H, outcome: "fail", code: null },
  },
  "test_run.revised": {
    eventType: "test_run.revised",
    recordType: "test_run",
    recordId: UUID,
    new: { number: "TR-0042", revision: 2, supersedes: UUID, evidenceLinks: 1 },
    reason: "Wrong membrane",
  },
  "test_run.superseded": {
    eventType: "test_run.superseded",
    recordType: "test_run",
    recordId: UUID,
    old: { status: "verified" },
    new: { status: "superseded", by: UUID },
    reason: "Wrong membrane",
  },
  "evidence_file.spec_source_uploaded": {
    eventType: "evidence_file.spec_source_uploaded",
    recordType: "evidence_file",
    recordId: UUID,
    new: {
      sha256: H,
      name: "OFP-CL-220 rev A.pdf",
      mimeType: "application/pdf",
      sizeBytes: 48211,
      storedNew: true,
    },
  },
  "evidence_file.uploaded": {
    eventType: "evidence_file.uploaded",
    recordType: "evidence_file",
    recordId: UUID,
    new: {
      run: "TR-0042 rev 1",
      runId: UUID,
      sha256: H,
      name: "report.pdf",
      mimeType: "application/pdf",
      sizeBytes: 20411,
      kind: "lab_report",
      storedNew: true,
    },
  },
  "evidence_file.downloaded": {
    eventType: "evidence_file.downloaded",
    recordType: "evidence_file",
    recordId: UUID,
    new: { sha256: H, name: "report.pdf" },
  },
  "evidence_file.detached": {
    eventType: "evidence_file.detached",
    recordType: "evidence_file",
    recordId: UUID,
    old: { run: "TR-0007 rev 1", runId: UUID },
    new: { reason: "Uploaded to the wrong run", sha256: H, name: "report.pdf", outcome: "pass" },
  },
  "evidence_file.integrity_failed": {
    eventType: "evidence_file.integrity_failed",
    recordType: "evidence_file",
    recordId: UUID,
    new: { expectedSha256: H, actualSha256: null, name: "report.pdf" },
  },
  // lib/server/bath/*.ts
  "bath_record.created": {
    eventType: "bath_record.created",
    recordType: "bath_record",
    recordId: UUID,
    new: {
      tank: "Tank 1",
      kind: "reading",
      concentrationPct: 2.5,
      temperatureC: 58,
      performedAt: AT,
    },
  },
  "maintenance_interval.set": {
    eventType: "maintenance_interval.set",
    recordType: "maintenance_interval",
    recordId: UUID,
    old: null,
    new: { tank: "Tank 1", kind: "filter_change", intervalDays: 28, warnDays: 2 },
  },
  "maintenance_interval.reminder_queued": {
    eventType: "maintenance_interval.reminder_queued",
    recordType: "maintenance_interval",
    recordId: UUID,
    new: { level: "overdue", dueAt: AT, recipients: 2 },
  },
  // lib/server/changes/*.ts
  "change.opened": {
    eventType: "change.opened",
    recordType: "change_request",
    recordId: UUID,
    new: {
      number: "CR-2026-004",
      title: "Hotter wash",
      kind: "parameter_change",
      recipe: "R-1",
      fromVersion: 2,
      toVersion: 3,
      narrativeDocument: "CN-2026-004",
    },
  },
  "change.proposal_saved": {
    eventType: "change.proposal_saved",
    recordType: "change_request",
    recordId: UUID,
    old: { title: "Hotter wash", kind: "parameter_change", raisedTo: null, lockVersion: 1 },
    new: {
      lockVersion: 2,
      title: "Hotter wash",
      kind: "parameter_change",
      raisedTo: "major",
      computedImpact: "minor",
      parameters: [
        {
          key: "wash.temperature",
          old: { setpoint: 55, unit: "°C", low: 50, high: 65 },
          new: { setpoint: 60, unit: "°C", low: 50, high: 65 },
        },
      ],
    },
    reason: "Customer asked for full requalification",
  },
  "change.impact_assessed": {
    eventType: "change.impact_assessed",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "draft" },
    new: {
      status: "impact_assessed",
      impact: "major",
      computed: "minor",
      matrixVersion: 1,
      tests: ["particle_cleanliness × 22"],
      contentHash: H,
    },
    reason: "Customer asked for full requalification",
  },
  "change.reopened": {
    eventType: "change.reopened",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "impact_assessed", revision: 1 },
    new: { status: "draft", revision: 2 },
    reason: "Wrong range",
  },
  "change.approved": {
    eventType: "change.approved",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "impact_assessed" },
    new: { status: "approved_for_implementation", impact: "major" },
  },
  "change.requalification_started": {
    eventType: "change.requalification_started",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "approved_for_implementation" },
    new: { status: "requalification" },
  },
  "change.evidence_linked": {
    eventType: "change.evidence_linked",
    recordType: "change_request",
    recordId: UUID,
    new: { requirement: "particle_cleanliness", samplesRequired: 22, testRun: "TR-0042" },
  },
  "change.verified": {
    eventType: "change.verified",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "requalification" },
    new: { status: "verified", evidence: ["particle_cleanliness: TR-0042"] },
  },
  "change.closed": {
    eventType: "change.closed",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "verified" },
    new: { status: "closed", effectiveVersion: 3 },
  },
  "change.rejected": {
    eventType: "change.rejected",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "impact_assessed" },
    new: { status: "rejected" },
    reason: "Out of range",
  },
  "change.withdrawn": {
    eventType: "change.withdrawn",
    recordType: "change_request",
    recordId: UUID,
    old: { status: "draft" },
    new: { status: "withdrawn" },
    reason: "Duplicate",
  },
  // lib/server/matrix/version-matrix.ts
  "requalification_matrix.versioned": {
    eventType: "requalification_matrix.versioned",
    recordType: "requalification_matrix",
    recordId: UUID,
    old: { version: 1, removed: [] },
    new: { version: 2, added: ["wash.temperature → particle_cleanliness @ 95/90"], rows: 12 },
    reason: "Added the wash temperature",
  },
  // lib/server/changes/set-requalification-interval.ts (close-change.ts writes the first one)
  "requalification_interval.set": {
    eventType: "requalification_interval.set",
    recordType: "requalification_interval",
    recordId: UUID,
    old: { intervalMonths: 12 },
    new: { intervalMonths: 6 },
    reason: "Two failures last year",
  },
  "requalification_interval.reminder_sent": {
    eventType: "requalification_interval.reminder_sent",
    recordType: "requalification_interval",
    recordId: UUID,
    new: { due: AT, state: "due_soon", to: ["eng@example.test"] },
  },
  // lib/server/trace/export-audit-pack.ts
  "audit_pack.exported": {
    eventType: "audit_pack.exported",
    recordType: "change_request",
    recordId: UUID,
    new: {
      number: "CR-2026-004",
      format: "zip",
      pdfSha256: H,
      bytes: 90210,
      files: 3,
      filesRefused: 1,
    },
  },
  // lib/server/api-tokens/*.ts
  "api_token.created": {
    eventType: "api_token.created",
    recordType: "api_token",
    recordId: UUID,
    new: { name: "LIMS", scope: "read_write", prefix: "wp_ab12" },
  },
  "api_token.revoked": {
    eventType: "api_token.revoked",
    recordType: "api_token",
    recordId: UUID,
    old: { revokedAt: null },
    new: { name: "LIMS", prefix: "wp_ab12", revokedAt: AT },
  },
  // lib/server/deviations/create-deviation.ts
  "deviation.created": {
    eventType: "deviation.created",
    recordType: "deviation",
    recordId: UUID,
    new: {
      number: "DV-2026-001",
      recipe: "R-AW3-VB",
      title: "Substitute detergent while the usual one is unavailable",
      riskLevel: "medium",
      endsOn: "2026-12-20",
      maxLots: 12,
      reminderDays: 3,
      partFamilies: ["PF-VB-210"],
      parameters: [{ key: "wash.concentration", temporaryLow: 2, temporaryHigh: 4.5 }],
      contentHash: "a".repeat(64),
    },
  },
  // lib/server/deviations/sign-deviation.ts
  "deviation.approved": {
    eventType: "deviation.approved",
    recordType: "deviation",
    recordId: UUID,
    old: { status: "draft" },
    new: { status: "approved", contentHash: "a".repeat(64) },
  },
  // lib/server/deviations/withdraw-deviation.ts
  "deviation.withdrawn": {
    eventType: "deviation.withdrawn",
    recordType: "deviation",
    recordId: UUID,
    old: { status: "approved" },
    new: { status: "withdrawn" },
    reason: "The usual detergent was delivered early.",
  },
  // lib/server/deviations/run-deviation-job.ts
  "deviation.expired": {
    eventType: "deviation.expired",
    recordType: "deviation",
    recordId: UUID,
    old: { status: "approved" },
    new: { status: "expired", because: "end_date", endsOn: "2026-12-20", lotsUsed: 4 },
  },
  "deviation.reminder_sent": {
    eventType: "deviation.reminder_sent",
    recordType: "deviation",
    recordId: UUID,
    new: { endsOn: "2026-12-20", daysLeft: 3, to: ["engineer@fennmoor.example"] },
  },
  // lib/server/deviations/record-lot.ts
  "deviation.lot_recorded": {
    eventType: "deviation.lot_recorded",
    recordType: "deviation",
    recordId: UUID,
    new: { lot: "L-2026-1204", lotsUsed: 1, maxLots: 12 },
  },
  // lib/server/plant/set-family-picture.ts
  "part_family.picture_set": {
    eventType: "part_family.picture_set",
    recordType: "part_family",
    recordId: UUID,
    old: null,
    new: {
      fileId: UUID,
      sha256: "a".repeat(64),
      name: "vb-210.jpg",
      mimeType: "image/jpeg",
      sizeBytes: 48213,
    },
  },
  // lib/server/bath/*.ts (measurement plan)
  "detergent.saved": {
    eventType: "detergent.saved",
    recordType: "detergent",
    recordId: UUID,
    old: null,
    new: { name: "Alkaline cleaner A", supplier: null, titrationMethod: null, factorPctPerMl: 0.5 },
  },
  "bath_limit.set": {
    eventType: "bath_limit.set",
    recordType: "bath_limit",
    recordId: UUID,
    old: null,
    new: {
      tank: "Wash tank",
      variable: "concentrationPct",
      recipe: "R-100 v2",
      recipeVersionId: UUID,
      detergent: "Alkaline cleaner A",
      target: 3,
      actionLow: 2.5,
      actionHigh: 3.5,
      rejectLow: 2,
      rejectHigh: 4,
    },
  },
  "bath_record.flagged": {
    eventType: "bath_record.flagged",
    recordType: "bath_record",
    recordId: UUID,
    new: {
      tank: "Wash tank",
      state: "reject",
      findings: ["Detergent concentration 4.4 % is above the reject limit 4 %"],
    },
  },
  "evidence_file.check_photo_uploaded": {
    eventType: "evidence_file.check_photo_uploaded",
    recordType: "evidence_file",
    recordId: UUID,
    new: { sha256: H, name: "foil.jpg", mimeType: "image/jpeg", sizeBytes: 2048, storedNew: true },
  },
  "wash_cycles.recorded": {
    eventType: "wash_cycles.recorded",
    recordType: "wash_cycle_batch",
    recordId: UUID,
    new: {
      source: "csv",
      count: 2,
      cycles: ["AW3-240311-001", "AW3-240311-002"],
      flagged: 1,
      fileName: "aw3-log.csv",
      sha256: "a".repeat(64),
    },
  },
  "wash_cycle.flagged": {
    eventType: "wash_cycle.flagged",
    recordType: "wash_cycle",
    recordId: UUID,
    new: {
      cycleNumber: "AW3-240311-002",
      system: "AW-3",
      lots: ["L24-0311-A"],
      reasons: ["Wash temperature 54 °C is below its validated range 55–65 °C."],
    },
  },
  "test_run.lab_details_saved": {
    eventType: "test_run.lab_details_saved",
    recordType: "test_run",
    recordId: UUID,
    old: { details: null },
    new: { details: { analysis: { system: "sem_edx", magnification: 100, lowerSizeLimitUm: 50 } } },
  },
  "test_run.report_exported": {
    eventType: "test_run.report_exported",
    recordType: "test_run",
    recordId: UUID,
    new: { format: "pdf", number: "TR-2026-001", revision: 1, contentHash: H, bytes: 20480 },
  },
  // lib/server/nonconformances/*.ts
  "nonconformance.raised": {
    eventType: "nonconformance.raised",
    recordType: "nonconformance",
    recordId: UUID,
    new: {
      number: "NC-2026-001",
      title: "TR-2026-014 verified as Fail (particle cleanliness)",
      severity: "major",
      source: "run",
      sourceLabel: "TR-2026-014",
      manualKind: null,
      detectedOn: "2026-03-12",
      recipe: "VB-WASH-01",
      partFamily: "VB-210",
      affectedItems: ["TR-2026-012", "TR-2026-014"],
    },
  },
  "nonconformance.assigned": {
    eventType: "nonconformance.assigned",
    recordType: "nonconformance",
    recordId: UUID,
    old: { owner: null, dueOn: null },
    new: { owner: "Quality Engineer", dueOn: "2026-04-01" },
  },
  "nonconformance.item_hold_set": {
    eventType: "nonconformance.item_hold_set",
    recordType: "nonconformance",
    recordId: UUID,
    old: { item: "TR-2026-014", hold: "pending" },
    new: { item: "TR-2026-014", hold: "held" },
  },
  "nonconformance.item_disposed": {
    eventType: "nonconformance.item_disposed",
    recordType: "nonconformance",
    recordId: UUID,
    old: { item: "TR-2026-014", disposition: null },
    new: {
      item: "TR-2026-014",
      disposition: "use_as_is",
      recleanRecipe: null,
      concessionReference: "CONC-77",
      concessionFile: H,
      note: null,
    },
  },
  "nonconformance.root_cause_saved": {
    eventType: "nonconformance.root_cause_saved",
    recordType: "nonconformance",
    recordId: UUID,
    old: { method: null, contentHash: null },
    new: { method: "five_whys", contentHash: H },
  },
  "nonconformance.status_changed": {
    eventType: "nonconformance.status_changed",
    recordType: "nonconformance",
    recordId: UUID,
    old: { status: "open" },
    new: { status: "cancelled" },
    reason: "Raised twice for the same run.",
  },
  "nonconformance.action_added": {
    eventType: "nonconformance.action_added",
    recordType: "nonconformance",
    recordId: UUID,
    new: {
      action: UUID,
      kind: "corrective",
      description: "Shorten the filter interval",
      owner: "Quality Engineer",
      dueOn: "2026-04-01",
    },
  },
  "nonconformance.action_updated": {
    eventType: "nonconformance.action_updated",
    recordType: "nonconformance",
    recordId: UUID,
    old: { action: UUID, status: "open", evidenceLink: null },
    new: { action: UUID, status: "done", evidenceLink: "CR-2026-004" },
  },
  "nonconformance.change_opened": {
    eventType: "nonconformance.change_opened",
    recordType: "nonconformance",
    recordId: UUID,
    new: { action: UUID, changeRequest: "CR-2026-004", joinedOpenChange: false },
  },
  "nonconformance.effectiveness_planned": {
    eventType: "nonconformance.effectiveness_planned",
    recordType: "nonconformance",
    recordId: UUID,
    old: { criterion: null, dueOn: null },
    new: { criterion: "Next three verified runs pass", dueOn: "2026-05-01" },
  },
  "nonconformance.effectiveness_recorded": {
    eventType: "nonconformance.effectiveness_recorded",
    recordType: "nonconformance",
    recordId: UUID,
    new: { result: "confirmed", evidenceRun: "TR-2026-020", evidenceFile: null, note: null },
  },
  "nonconformance.file_attached": {
    eventType: "nonconformance.file_attached",
    recordType: "nonconformance",
    recordId: UUID,
    new: { file: UUID, name: "concession.pdf", sha256: H, storedNew: true },
  },
  "nonconformance.reminder_sent": {
    eventType: "nonconformance.reminder_sent",
    recordType: "nonconformance",
    recordId: UUID,
    new: {
      subject: `action:${UUID}`,
      dueOn: "2026-04-01",
      level: "overdue",
      to: ["eng@example.test"],
    },
  },
  "change_control_settings.saved": {
    eventType: "change_control_settings.saved",
    recordType: "change_control_settings",
    recordId: "change_control",
    old: { emergencyApprovalDays: 3, effectivenessRuns: 3 },
    new: { emergencyApprovalDays: 2, effectivenessRuns: 5 },
  },
  "change.emergency_implemented": {
    eventType: "change.emergency_implemented",
    recordType: "change_request",
    recordId: UUID,
    new: {
      effectiveVersion: 3,
      supersededVersion: 2,
      approvalDueOn: "2026-12-05",
      contentHash: "a".repeat(64),
    },
    reason: "Detergent supplier cannot deliver; the bath must be recharged today.",
  },
  "change.emergency_escalated": {
    eventType: "change.emergency_escalated",
    recordType: "change_request",
    recordId: UUID,
    new: { approvalDueOn: "2026-12-05", to: ["approver@fennmoor.example"] },
  },
  "recipe_version.emergency_reversed": {
    eventType: "recipe_version.emergency_reversed",
    recordType: "recipe_version",
    recordId: UUID,
    old: { status: "effective" },
    new: {
      status: "withdrawn",
      effectiveTo: "2026-12-04T09:00:00.000Z",
      changeRequest: "CR-2026-004",
    },
    reason: "Rejected: the substitute detergent foams at 60 °C.",
  },
  "recipe_version.restored": {
    eventType: "recipe_version.restored",
    recordType: "recipe_version",
    recordId: UUID,
    old: { status: "superseded" },
    new: { status: "effective", changeRequest: "CR-2026-004" },
    reason: "Rejected: the substitute detergent foams at 60 °C.",
  },
  "change.document_listed": {
    eventType: "change.document_listed",
    recordType: "change_request",
    recordId: UUID,
    new: { document: "WI-AW3-01", title: "Loading the baskets", entry: UUID },
  },
  "change.document_confirmed_unaffected": {
    eventType: "change.document_confirmed_unaffected",
    recordType: "change_request",
    recordId: UUID,
    old: { unaffectedReason: null },
    new: { document: "WI-AW3-01", unaffectedReason: "Quotes the recipe by reference only." },
  },
  "change.effectiveness_check_opened": {
    eventType: "change.effectiveness_check_opened",
    recordType: "change_request",
    recordId: UUID,
    new: { requiredRuns: 3, countsFrom: "2026-12-04T09:00:00.000Z" },
  },
  "change.effectiveness_confirmed": {
    eventType: "change.effectiveness_confirmed",
    recordType: "change_request",
    recordId: UUID,
    new: { runs: ["TR-2026-010", "TR-2026-011", "TR-2026-012"], required: 3 },
  },
  "change.effectiveness_failed": {
    eventType: "change.effectiveness_failed",
    recordType: "change_request",
    recordId: UUID,
    new: { runs: ["TR-2026-010", "TR-2026-011"], required: 3, failedRun: "TR-2026-011" },
  },
  "evidence_file.customer_letter_uploaded": {
    eventType: "evidence_file.customer_letter_uploaded",
    recordType: "evidence_file",
    recordId: UUID,
    new: {
      sha256: H,
      name: "NH approval 2026-114.pdf",
      mimeType: "application/pdf",
      sizeBytes: 30211,
      storedNew: true,
    },
  },
  "change.customer_decision_recorded": {
    eventType: "change.customer_decision_recorded",
    recordType: "change_request",
    recordId: UUID,
    old: null,
    new: {
      specification: "NH-CL-7 rev 2 (Norrland Hydraulics)",
      decision: "approved",
      decidedOn: "2026-11-28",
      reference: "NH-QA-2026-114",
      letterSha256: H,
      entry: UUID,
    },
  },
  "control_plan.created": {
    eventType: "control_plan.created",
    recordType: "control_plan_version",
    recordId: UUID,
    new: { combination: "VB-STD version 2 × VB-100", version: 1, lines: 3, contentHash: H },
  },
  "control_plan.draft_saved": {
    eventType: "control_plan.draft_saved",
    recordType: "control_plan_version",
    recordId: UUID,
    old: { lines: 3, contentHash: H },
    new: { lines: 4, contentHash: H },
  },
  "control_plan.revised": {
    eventType: "control_plan.revised",
    recordType: "control_plan_version",
    recordId: UUID,
    new: {
      combination: "VB-STD version 2 × VB-100",
      version: 2,
      fromVersion: 1,
      note: "Weekly gravimetric added",
      contentHash: H,
    },
  },
  "control_plan.status_changed": {
    eventType: "control_plan.status_changed",
    recordType: "control_plan_version",
    recordId: UUID,
    old: { status: "reviewed" },
    new: { status: "effective", contentHash: H },
  },
  "control_plan.overdue_notified": {
    eventType: "control_plan.overdue_notified",
    recordType: "control_plan_line",
    recordId: UUID,
    new: {
      characteristic: "particle_cleanliness",
      combination: "VB-STD version 2 × VB-100",
      dueAt: "2026-11-30T05:00:00.000Z",
      to: ["technician@fennmoor.example"],
    },
  },
  "site.clock_saved": {
    eventType: "site.clock_saved",
    recordType: "site",
    recordId: UUID,
    old: null,
    new: { timeZone: "Europe/Berlin", shiftStarts: ["06:00", "14:00", "22:00"] },
  },
  // lib/server/instruments/create-instrument.ts
  "instrument.created": {
    eventType: "instrument.created",
    recordType: "instrument",
    recordId: UUID,
    new: {
      assetNumber: "BAL-01",
      kind: "balance",
      description: "Analytical balance, filter weighing",
      location: "Cleanliness lab",
      range: "0–220 g",
      resolution: "0.01 mg",
      status: "in_service",
      statusReason: null,
      calibrationIntervalMonths: 12,
      expiresOn: null,
    },
  },
  // lib/server/instruments/update-instrument.ts: only what changed
  "instrument.updated": {
    eventType: "instrument.updated",
    recordType: "instrument",
    recordId: UUID,
    old: { location: "Cleanliness lab", status: "in_service", statusReason: null },
    new: { location: "Goods-in lab", status: "out_of_service", statusReason: "Sent for repair" },
  },
  "instrument.retired": {
    eventType: "instrument.retired",
    recordType: "instrument",
    recordId: UUID,
    old: { status: "out_of_service" },
    new: { status: "retired" },
    reason: "Load cell failed; replaced by BAL-02.",
  },
  // lib/server/instruments/record-calibration.ts
  "instrument.calibrated": {
    eventType: "instrument.calibrated",
    recordType: "instrument",
    recordId: UUID,
    old: { dueOn: "2026-11-30" },
    new: {
      calibrationId: UUID,
      calibratedOn: "2026-12-02",
      dueOn: "2027-12-02",
      performer: "external",
      performedBy: "Calibration lab",
      certificateNumber: "C-2026-0412",
      certificateSha256: H,
      result: "out_of_tolerance",
      note: null,
      nonconformance: "NC-2026-004",
      suspectRuns: ["TR-2026-0007"],
    },
  },
  // lib/server/instruments/send-overdue-notices.ts
  "instrument.overdue_notice_sent": {
    eventType: "instrument.overdue_notice_sent",
    recordType: "instrument",
    recordId: UUID,
    new: { dueOn: "2026-11-30", to: ["lab@example.test"] },
  },
  // lib/server/instruments/cite-instruments.ts
  "test_run.instruments_cited": {
    eventType: "test_run.instruments_cited",
    recordType: "test_run",
    recordId: UUID,
    old: { instruments: [] },
    new: { instruments: ["BAL-01", "TH-03"] },
  },
  // lib/server/instruments/store-certificate.ts
  "evidence_file.certificate_uploaded": {
    eventType: "evidence_file.certificate_uploaded",
    recordType: "evidence_file",
    recordId: UUID,
    new: {
      sha256: H,
      name: "BAL-01 certificate.pdf",
      mimeType: "application/pdf",
      sizeBytes: 20480,
      storedNew: true,
    },
  },
  "lab_method.drafted": {
    eventType: "lab_method.drafted",
    recordType: "lab_method",
    recordId: UUID,
    new: {
      code: "AN-01",
      version: 2,
      kind: "analysis",
      name: "Membrane analysis, automated light microscope",
      details: { magnification: 50, lowerSizeLimitUm: 15 },
      qualificationRun: null,
      trainingIntervalMonths: 24,
    },
  },
  "lab_method.approved": {
    eventType: "lab_method.approved",
    recordType: "lab_method",
    recordId: UUID,
    old: { status: "draft" },
    new: { status: "approved", contentHash: H, supersedes: "AN-01 v1" },
  },
  "lab_method.superseded": {
    eventType: "lab_method.superseded",
    recordType: "lab_method",
    recordId: UUID,
    old: { status: "approved" },
    new: { status: "superseded", by: "AN-01 v2" },
  },
  "test_run.methods_cited": {
    eventType: "test_run.methods_cited",
    recordType: "test_run",
    recordId: UUID,
    old: { extraction: null, analysis: null, gravimetric: null },
    new: { extraction: "EX-01 v1", analysis: "AN-01 v2", gravimetric: null },
  },
  "training.signed_off": {
    eventType: "training.signed_off",
    recordType: "training_record",
    recordId: UUID,
    new: {
      person: "Ravi Menon",
      method: "GR-01 v1",
      trainedOn: "2026-12-03",
      expiresOn: "2028-12-03",
      trainer: "Helena Okafor",
      contentHash: H,
    },
  },
  "training.procedure_acknowledged": {
    eventType: "training.procedure_acknowledged",
    recordType: "training_record",
    recordId: UUID,
    new: {
      person: "Ravi Menon",
      procedure: "SOP-LAB-001 v1",
      trainedOn: "2026-12-03",
      expiresOn: "2028-12-03",
      contentHash: H,
    },
  },
  "training.reminder_sent": {
    eventType: "training.reminder_sent",
    recordType: "training_record",
    recordId: UUID,
    new: { subject: "GR-01", expiresOn: "2026-12-20", to: ["technician@fennmoor.example"] },
  },
} satisfies { [T in AuditEventType]: Extract<AuditEventInput, { eventType: T }> };

const samples = Object.values(SAMPLES) as AuditEventInput[];

describe("the audit event schemas", () => {
  it("have a sample for every event type, and every type is named <record or feature>.<what happened>", () => {
    expect(Object.keys(SAMPLES).sort()).toEqual([...AUDIT_EVENT_TYPES].sort());
    for (const type of AUDIT_EVENT_TYPES) expect(type).toMatch(/^[a-z_]+\.[a-z_]+$/);
  });

  it.each(samples.map((s) => [s.eventType, s] as const))(
    "%s accepts its service's payload and keeps every value",
    (_, sample) => {
      const parsed = auditEventSchema.parse(sample);
      expect(parsed.old ?? null).toEqual(sample.old ?? null);
      expect(parsed.new ?? null).toEqual(sample.new ?? null);
    },
  );

  it.each(samples.map((s) => [s.eventType, s] as const))(
    "%s refuses a key it does not name, and another record type",
    (_, sample) => {
      const side = sample.new ? "new" : "old";
      const values = (sample[side] as object | null | undefined) ?? {};
      expect(
        auditEventSchema.safeParse({ ...sample, [side]: { ...values, unexpected: 1 } }).success,
      ).toBe(false);
      expect(
        auditEventSchema.safeParse({
          ...sample,
          recordType: sample.recordType === "user" ? "document" : "user",
        }).success,
      ).toBe(false);
    },
  );

  it("refuses wrong values, not only wrong keys", () => {
    const wrong = [
      // the old name of a key: a sample is a sample
      {
        ...SAMPLES["test_run.sample_added"],
        new: { ...SAMPLES["test_run.sample_added"].new, sampleId: undefined, resultId: UUID },
      },
      {
        ...SAMPLES["test_run.performed"],
        new: { ...SAMPLES["test_run.performed"].new, outcome: "passed" },
      },
      {
        ...SAMPLES["signature.applied"],
        new: { ...SAMPLES["signature.applied"].new, contentHash: "abc" },
      },
      { ...SAMPLES["change.closed"], old: null },
      { ...SAMPLES["user.roles_changed"], new: { roles: ["owner"] } },
      { ...SAMPLES["auth.signed_in"], eventType: "auth.signed_on" },
    ];
    for (const event of wrong)
      expect(auditEventSchema.safeParse(event).success, JSON.stringify(event)).toBe(false);
  });
});

describe("events stored under an earlier name", () => {
  it("map to a current event type, and no current type is also a legacy name", () => {
    for (const [old, legacy] of Object.entries(LEGACY_EVENT_TYPES)) {
      expect(AUDIT_EVENT_TYPES).toContain(legacy.now);
      expect(AUDIT_EVENT_TYPES).not.toContain(old);
    }
    expect(currentEventType("test_run.result_added")).toBe("test_run.sample_added");
    expect(currentEventType("system.updated")).toBe("cleaning_system.updated");
    expect(currentEventType("change.closed")).toBe("change.closed");
    expect(storedNamesOf("test_run.sample_removed")).toEqual([
      "test_run.sample_removed",
      "test_run.result_removed",
    ]);
    expect(storedNamesOf("test_run.result_removed")).toEqual([
      "test_run.sample_removed",
      "test_run.result_removed",
    ]);
  });

  it("read back typed, with the renamed payload key, and say what they were stored as", () => {
    const read = readAuditEvent({
      action: "test_run.result_added",
      recordType: "test_run",
      recordId: UUID,
      oldValue: null,
      newValue: canonicalJson({
        resultId: UUID,
        sampleLabel: "VB-1",
        basketPosition: "corner",
        worstCase: false,
        data: { counts: { B: 3 } },
        outcome: "pass",
      }),
      reason: null,
    });
    expect(read.eventType).toBe("test_run.sample_added");
    expect(read.storedAs).toBe("test_run.result_added");
    expect(read.event?.eventType).toBe("test_run.sample_added");
    if (read.event?.eventType !== "test_run.sample_added") throw new Error("not typed");
    expect(read.event.new.sampleId).toBe(UUID);
    expect(describeChanges(read).map((c) => c.field)).toEqual([
      "basketPosition",
      "data",
      "outcome",
      "sampleId",
      "sampleLabel",
      "worstCase",
    ]);
  });

  it("still read when the stored values predate today's schema, as plain values", () => {
    const read = readAuditEvent({
      action: "document.effective",
      recordType: "document_version",
      recordId: UUID,
      oldValue: null,
      newValue: '{"effectiveDate":"2026-01-02","seeded":true,"status":"effective"}',
      reason: null,
    });
    expect(read.event).toBeNull();
    expect(read.eventType).toBe("document.effective");
    expect(describeChanges(read)).toEqual([
      { field: "effectiveDate", label: "Effective date", old: null, new: "2026-01-02" },
      { field: "seeded", label: "Seeded", old: null, new: "yes" },
      { field: "status", label: "Status", old: null, new: "Effective" },
    ]);
    const unknown = readAuditEvent({
      action: "thing.happened",
      recordType: "thing",
      recordId: "1",
      oldValue: "not json",
      newValue: "[1,2]",
      reason: null,
    });
    expect(unknown).toMatchObject({
      eventType: "thing.happened",
      event: null,
      old: { value: "not json" },
      new: { value: [1, 2] },
    });
  });
});

describe("a trail holding old and new names", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  beforeAll(async () => {
    t = await createTestDatabase();
    const actor = { id: "u-1", name: "Ada Brook" };
    await t.db.transaction((tx) =>
      appendAudit(tx, actor, SAMPLES["test_run.created"], new Date("2026-11-20T09:00:00Z")),
    );
    // Written the way the earlier version wrote it: the old name and key, chained like any row.
    const [last] = await t.db.select().from(auditEvents);
    const fields = {
      seq: 2,
      at: "2026-11-20T09:05:00.000Z",
      actorId: actor.id,
      actorName: actor.name,
      action: "test_run.result_added",
      recordType: "test_run",
      recordId: UUID,
      oldValue: null,
      newValue: canonicalJson({
        resultId: "r-old",
        sampleLabel: "VB-1",
        basketPosition: null,
        worstCase: false,
        data: {},
        outcome: "incomplete",
      }),
      reason: null,
      prevHash: last.hash,
    };
    await t.db.insert(auditEvents).values({ ...fields, hash: chainHash(fields) });
    await t.db.transaction((tx) =>
      appendAudit(tx, actor, SAMPLES["test_run.sample_added"], new Date("2026-11-20T09:10:00Z")),
    );
  });
  afterAll(() => t.cleanup());

  it("verifies as one chain", async () => {
    expect(await verifyAuditChain(t.db)).toMatchObject({ ok: true, events: 3 });
  });

  it("finds both names by today's name, shows them by it, and offers it once as a filter", async () => {
    const page = await queryAuditEvents(
      auditQuerySchema.parse({ eventType: "test_run.sample_added" }),
    );
    expect(page.items.map((e) => [e.seq, e.eventType, e.storedAs])).toEqual([
      [3, "test_run.sample_added", "test_run.sample_added"],
      [2, "test_run.sample_added", "test_run.result_added"],
    ]);
    expect(page.items[1].changes.find((c) => c.field === "sampleId")?.new).toBe("r-old");
    expect((await auditFilterOptions()).eventTypes).toEqual([
      "test_run.created",
      "test_run.sample_added",
    ]);
  });
});

describe("the seeded demo", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  beforeAll(async () => {
    t = await createTestDatabase();
    await seedDemo(t.db);
  }, 120_000);
  afterAll(() => t.cleanup());

  it("writes every event in the shape its service writes", async () => {
    const rows = await t.db.select().from(auditEvents);
    expect(rows.length).toBeGreaterThan(50);
    const misfits = rows.filter((r) => readAuditEvent(r).event === null).map((r) => r.action);
    expect(misfits).toEqual([]);
  });
});
