import { z } from "zod";
import {
  API_TOKEN_SCOPES,
  BATH_CHEMISTRY_KEYS,
  BATH_LIMIT_STATES,
  BATH_RECORD_KINDS,
  CHECK_RESULTS,
  CHANGE_KINDS,
  CHANGE_STATUSES,
  DOCUMENT_STATUSES,
  DOCUMENT_TYPES,
  IMPACT_CLASSES,
  MAINTENANCE_KINDS,
  OUTCOMES,
  ROLES,
  ROUTING_MODES,
  RUN_STATUSES,
  SIGNATURE_MEANINGS,
  TEST_TYPES,
  EVIDENCE_FILE_KINDS,
  NC_ACTION_KINDS,
  NC_ACTION_STATUSES,
  NC_CAUSE_METHODS,
  NC_DISPOSITIONS,
  NC_EFFECTIVENESS_RESULTS,
  NC_HOLD_STATES,
  NC_MANUAL_KINDS,
  NC_SEVERITIES,
  NC_SOURCE_KINDS,
  NC_STATUSES,
  LAB_METHOD_KINDS,
} from "@/db/enums";
import { RISK_LEVELS } from "@/lib/deviations/rules";
import { CHARACTERISTICS, CONTROL_PLAN_STATUSES } from "@/lib/control-plans/characteristics";
import {
  CALIBRATION_PERFORMERS,
  CALIBRATION_RESULTS,
  INSTRUMENT_KINDS,
  INSTRUMENT_STATUSES,
} from "@/lib/instruments/kinds";

// ── Building blocks of the payloads ──────────────────────────────────────
// Payloads are strict: a key a schema does not name is refused rather than
// silently dropped, so nothing a service meant to record goes missing.

const text = z.string();
const id = z.string().min(1);
const sha256 = z.string().regex(/^[0-9a-f]{64}$/);
const isoTime = z.string().min(10);
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/);
const count = z.number().int().nonnegative();
const version = z.number().int().positive();
const outcome = z.enum(OUTCOMES);
const jsonObject = z.record(z.string(), z.unknown());
/** A sample's raw values, as the evidence schemas (lib/schemas/evidence.ts) checked them per test type. */
const sampleData = z.unknown();
const obj = z.strictObject;

const runStatus = z.enum(RUN_STATUSES);
const changeStatus = z.enum(CHANGE_STATUSES);
const documentStatus = z.enum(DOCUMENT_STATUSES);
const userDetails = obj({ name: text, email: text, jobTitle: text.nullable() }).partial();
const parameterValue = obj({
  setpoint: z.number(),
  unit: text,
  low: z.number().nullable(),
  high: z.number().nullable(),
}).nullable();

/** One service writes both signing events with the same shape. */
const signedRun = obj({ status: runStatus, contentHash: sha256, outcome, code: text.nullable() });

const none = z.null().default(null);

function event<
  const T extends string,
  const R extends string,
  O extends z.ZodType = typeof none,
  N extends z.ZodType = typeof none,
>(eventType: T, recordType: R, values: { old?: O; new?: N } = {}) {
  return z.strictObject({
    eventType: z.literal(eventType),
    recordType: z.literal(recordType),
    recordId: id,
    old: (values.old ?? none) as O,
    new: (values.new ?? none) as N,
    reason: z.string().max(4000).nullable().default(null),
  });
}

/**
 * Every kind of event the audit trail records, one schema each with the shape of
 * its old and new values. The name is `<record>.<what happened>`, the record named
 * as on the screens (or the feature, where its events span records: auth, audit,
 * document, change). A renamed type keeps its old name in LEGACY_EVENT_TYPES
 * (./read.ts), because stored events are never rewritten.
 */
/** A part family as its services record it. */
const familyDetails = obj({
  code: text,
  name: text,
  partNumbers: z.array(text),
  material: text,
  wettedAreaCm2: z.number(),
  wettedAreaMethod: text.nullable(),
  wettedAreaNote: text.nullable(),
  wettedVolumeCm3: z.number().nullable(),
  drawingNumber: text.nullable(),
  drawingRevision: text.nullable(),
  customer: text.nullable(),
  specification: text,
  description: text.nullable(),
});

/** One revision of a customer's cleanliness specification as its services record it. */
const specDetails = obj({
  code: text,
  name: text,
  customer: text.nullable(),
  documentNumber: text.nullable(),
  revision: text,
  sourceFileId: text.nullable(),
  ccc: text.nullable(),
  maxMetallicUm: z.number().nullable(),
  maxNonMetallicUm: z.number().nullable(),
  maxFibreUm: z.number().nullable(),
  gravimetricLimitMg: z.number().nullable(),
  gravimetricBasis: z.enum(["per_component", "per_1000_cm2"]).nullable(),
  minWettingTensionMNm: z.number().nullable(),
  visualCriteria: text.nullable(),
  drynessCriteria: text.nullable(),
  extraRequirements: text.nullable(),
  customerApprovesChanges: z.boolean(),
});

/** An instrument's register entry as its created and updated events record it. */
const instrumentDetails = obj({
  assetNumber: text,
  kind: z.enum(INSTRUMENT_KINDS),
  description: text,
  location: text,
  range: text.nullable(),
  resolution: text.nullable(),
  status: z.enum(INSTRUMENT_STATUSES),
  statusReason: text.nullable(),
  calibrationIntervalMonths: count.nullable(),
  expiresOn: isoDate.nullable(),
});

export const auditEventSchema = z.discriminatedUnion("eventType", [
  // Accounts
  event("auth.signed_in", "user"),
  event("auth.signed_out", "user"),
  event("auth.sign_in_failed", "user", {
    new: obj({
      reason: z.enum(["wrong password", "account locked", "account deactivated"]),
      during: z.enum(["sign_in", "signing"]),
      sourceAddress: text.optional(),
    }),
  }),
  event("auth.locked_out", "user", {
    new: obj({ lockedUntil: isoTime.nullable(), attempts: count }),
  }),
  event("auth.password_changed", "user"),
  event("user.created", "user", {
    new: obj({ name: text, email: text, jobTitle: text.nullable(), roles: z.array(z.enum(ROLES)) }),
  }),
  event("user.updated", "user", { old: userDetails, new: userDetails }),
  event("user.roles_changed", "user", {
    old: obj({ roles: z.array(z.enum(ROLES)) }),
    new: obj({ roles: z.array(z.enum(ROLES)) }),
  }),
  event("user.deactivated", "user", {
    old: obj({ active: z.boolean() }),
    // The API tokens the deactivation suspended.
    new: obj({ active: z.boolean(), suspendedApiTokens: z.array(text).optional() }),
  }),
  event("user.reactivated", "user", {
    old: obj({ active: z.boolean() }),
    new: obj({ active: z.boolean(), suspendedApiTokens: z.array(text).optional() }),
  }),
  event("user.password_reset", "user", {
    new: obj({ mustChangePassword: z.literal(true), suspendedApiTokens: z.array(text).optional() }),
  }),
  // Plant, parts and recipes
  event("company.set_up", "company", { new: obj({ companyName: text }) }),
  event("site.created", "site", { new: obj({ name: text, location: text.nullable() }) }),
  event("cleaning_system.created", "cleaning_system", {
    new: z.union([
      obj({
        code: text,
        assetNumber: text.nullable(),
        name: text,
        kind: text,
        description: text.nullable(),
        stages: z.array(text),
      }),
      // Before asset numbers and kinds were recorded.
      obj({ code: text, name: text, stages: z.array(text) }),
    ]),
  }),
  event("cleaning_system.retired", "cleaning_system", {
    old: obj({ active: z.literal(true) }),
    new: obj({ active: z.literal(false), retiredAt: isoTime }),
  }),
  event("cleaning_system.updated", "cleaning_system", {
    // Each stage as one line: "name (kind; capabilities; volume)".
    old: obj({ name: text, description: text.nullable(), stages: z.array(text) }),
    new: obj({ name: text, description: text.nullable(), stages: z.array(text) }),
  }),
  event("cleanliness_spec.revised", "cleanliness_spec", { old: specDetails, new: specDetails }),
  event("cleanliness_spec.superseded", "cleanliness_spec", {
    old: obj({ status: z.literal("in_force") }),
    new: obj({ status: z.literal("superseded"), by: text }),
  }),
  event("cleanliness_spec.created", "cleanliness_spec", {
    new: specDetails.or(
      obj({
        code: text,
        name: text,
        ccc: text.nullable(),
        maxMetallicUm: z.number().nullable(),
        maxNonMetallicUm: z.number().nullable(),
        maxFibreUm: z.number().nullable(),
        gravimetricLimitMg: z.number().nullable(),
        gravimetricBasis: z.enum(["per_component", "per_1000_cm2"]).nullable(),
        minWettingTensionMNm: z.number().nullable(),
        visualCriteria: text.nullable(),
        drynessCriteria: text.nullable(),
      }).partial({
        ccc: true,
        maxMetallicUm: true,
        maxNonMetallicUm: true,
        maxFibreUm: true,
        gravimetricLimitMg: true,
        gravimetricBasis: true,
        minWettingTensionMNm: true,
        visualCriteria: true,
        drynessCriteria: true,
      }),
    ),
  }),
  event("part_family.updated", "part_family", {
    // A whole edit, or only the specification a new revision moved it to.
    old: familyDetails.or(obj({ specification: text })),
    new: familyDetails.or(obj({ specification: text })),
  }),
  event("part_family.created", "part_family", {
    new: familyDetails.or(
      obj({
        code: text,
        name: text,
        material: text,
        wettedAreaCm2: z.number(),
        wettedVolumeCm3: z.number().nullable(),
        spec: text,
      }),
    ),
  }),
  event("combination.qualified", "requalification_interval", {
    new: obj({ combination: text, basis: text, qualifiedOn: text, intervalMonths: count }),
  }),
  event("recipe.created", "recipe", {
    new: obj({ code: text, name: text, system: text, description: text.nullable() }).or(
      obj({ code: text, name: text }),
    ),
  }),
  event("recipe_version.created", "recipe_version", {
    new: z.union([
      // A new recipe's first version, with its whole content as entered.
      obj({
        recipe: text,
        version,
        status: z.literal("draft"),
        content: z.record(z.string(), z.unknown()),
      }),
      obj({ recipe: text, version, notes: text.nullable() }),
    ]),
  }),
  event("recipe_version.proposed", "recipe_version", {
    new: obj({ recipe: text, version, copiedFrom: version, changeRequest: text }),
  }),
  // The first version of a seeded recipe is effective from the start: it had no earlier status.
  event("recipe_version.effective", "recipe_version", {
    old: obj({ status: z.literal("proposed") })
      .nullable()
      .default(null),
    new: obj({
      status: z.literal("effective"),
      effectiveFrom: isoTime,
      changeRequest: text.optional(),
    }),
  }),
  event("recipe_version.superseded", "recipe_version", {
    old: obj({ status: z.literal("effective") }),
    new: obj({
      status: z.literal("superseded"),
      effectiveTo: isoTime,
      by: version,
      changeRequest: text.optional(),
    }),
  }),
  // A new recipe's draft routed for its initial validation, and back to draft when that ends unclosed.
  event("recipe_version.validation_opened", "recipe_version", {
    old: obj({ status: z.literal("draft") }),
    new: obj({ status: z.literal("proposed"), changeRequest: text, partFamily: text }),
  }),
  event("recipe_version.returned_to_draft", "recipe_version", {
    old: obj({ status: z.literal("proposed") }),
    new: obj({ status: z.literal("draft"), changeRequest: text }),
  }),
  event("recipe_version.withdrawn", "recipe_version", {
    old: obj({ status: z.literal("proposed") }),
    new: obj({ status: z.literal("withdrawn"), changeRequest: text }),
  }),
  // Signatures, e-mail and the trail itself
  event("signature.applied", "signature", {
    new: obj({
      on: text,
      meaning: z.enum(SIGNATURE_MEANINGS),
      printedName: text,
      contentHash: sha256,
      signedAt: isoTime,
    }),
  }),
  event("email.test_sent", "email", { new: obj({ to: text }) }),
  event("audit.exported", "audit_trail", {
    new: obj({ filters: z.record(z.string(), z.union([text, z.number()])) }),
  }),
  event("audit.verified", "audit_trail", {
    new: z.union([
      // Since checkpoints: the chain, the checkpoints and every signature, with what was found.
      obj({
        ok: z.boolean(),
        events: count,
        checkpoints: count,
        signatures: count,
        findings: z.array(text),
      }),
      // Before them: the chain alone.
      obj({ ok: z.literal(true), events: count }),
      obj({ ok: z.literal(false), brokenAt: z.number().int(), reason: text }),
    ]),
  }),
  event("audit.checkpointed", "audit_trail", {
    new: obj({
      seq: count,
      hash: sha256,
      at: isoTime,
      keyId: text,
      signature: text,
      emailedTo: text.nullable(),
      mailId: text.nullable(),
    }),
  }),
  // Controlled documents: the document's life, recorded on the version it concerns
  event("document.created", "document", {
    new: obj({
      number: text,
      title: text,
      type: z.enum(DOCUMENT_TYPES),
      system: text.nullable(),
      partFamily: text.nullable(),
      recipeVersion: text.nullable(),
      versionId: id,
      sampleSize: count.nullable(),
    }),
  }),
  event("document.edited", "document_version", {
    old: obj({ contentHash: sha256, lockVersion: count }),
    new: obj({
      contentHash: sha256,
      lockVersion: count,
      savedOverNewer: z.literal(true).optional(),
    }),
  }),
  event("document.submitted", "document_version", {
    old: obj({ status: documentStatus }),
    new: obj({
      status: z.literal("in_review"),
      number: text,
      version,
      contentHash: sha256,
      round: version,
      routing: z.enum(ROUTING_MODES),
      reviewers: z.array(id),
      approver: id,
      due: isoTime.nullable(),
    }),
  }),
  event("document.reviewed", "document_version", {
    new: obj({ step: version, round: version, contentHash: sha256, nextStep: text.nullable() }),
  }),
  event("document.sent_back", "document_version", {
    old: obj({ status: z.literal("in_review"), contentHash: sha256.nullable() }),
    new: obj({ status: z.literal("draft"), round: version }),
  }),
  event("document.rejected", "document_version", {
    old: obj({ status: z.literal("in_review"), contentHash: sha256.nullable() }),
    new: obj({ status: z.literal("draft"), round: version }),
  }),
  event("document.approved", "document_version", {
    old: obj({ status: z.literal("in_review") }),
    new: obj({ status: z.literal("approved"), contentHash: sha256, effectiveDate: isoDate }),
  }),
  // A seeded version is effective from the start: it had no earlier status.
  event("document.effective", "document_version", {
    old: obj({ status: z.literal("approved") })
      .nullable()
      .default(null),
    new: obj({ status: z.literal("effective"), effectiveDate: isoDate.nullable(), version }),
  }),
  event("document.superseded", "document_version", {
    old: obj({ status: z.literal("effective"), version }),
    new: obj({ status: z.literal("superseded"), byVersion: version }),
  }),
  event("document.retired", "document_version", {
    old: obj({ status: z.literal("effective") }),
    new: obj({ status: z.literal("retired"), version }),
  }),
  event("document.version_started", "document_version", {
    new: obj({ version, from: version, contentHash: sha256 }),
  }),
  event("document.review_overdue", "document_review", {
    new: obj({ assignee: id, due: isoTime.nullable(), notifiedAt: isoTime }),
  }),
  event("document.exported", "document_version", {
    new: obj({
      format: z.literal("pdf"),
      number: text,
      version,
      status: documentStatus,
      contentHash: sha256,
      bytes: count,
    }),
  }),
  // Evidence: test runs, their samples, raw data and files, and the bath and filter log
  event("test_run.created", "test_run", {
    new: obj({
      number: text,
      partFamilyId: id,
      recipeVersionId: id,
      testType: z.enum(TEST_TYPES),
      technicianId: id,
      lab: text,
      performedOn: isoDate,
      protocolDocumentId: id.optional(),
      changeRequestId: id.optional(),
      requirement: text.optional(),
    }),
  }),
  event("test_run.sample_added", "test_run", {
    new: obj({
      sampleId: id,
      sampleLabel: text,
      // Since samples name their wash cycle (2026-12); absent when none was named.
      cycleNumber: text.optional(),
      basketPosition: text.nullable(),
      worstCase: z.boolean(),
      data: sampleData,
      outcome,
    }),
  }),
  event("test_run.sample_removed", "test_run", {
    old: obj({ sampleId: id, sampleLabel: text, data: sampleData }),
    new: obj({ outcome }),
  }),
  event("test_run.data_saved", "test_run", {
    old: obj({ runData: jsonObject.nullable() }),
    new: obj({ runData: jsonObject, outcome }),
  }),
  event("test_run.csv_imported", "test_run", {
    new: obj({ fileId: id, sha256, name: text, rows: count, samples: z.array(text), outcome }),
  }),
  event("test_run.performed", "test_run", { old: obj({ status: runStatus }), new: signedRun }),
  event("test_run.verified", "test_run", { old: obj({ status: runStatus }), new: signedRun }),
  event("test_run.revised", "test_run", {
    new: obj({ number: text, revision: version, supersedes: id, evidenceLinks: count }),
  }),
  event("test_run.superseded", "test_run", {
    old: obj({ status: runStatus }),
    new: obj({ status: z.literal("superseded"), by: id }),
  }),
  event("evidence_file.uploaded", "evidence_file", {
    new: obj({
      run: text,
      runId: id,
      sha256,
      name: text,
      mimeType: text,
      sizeBytes: count,
      kind: z.enum(EVIDENCE_FILE_KINDS),
      storedNew: z.boolean(),
    }),
  }),
  // A customer specification's source document: stored like evidence, bound to no run.
  event("evidence_file.spec_source_uploaded", "evidence_file", {
    new: obj({ sha256, name: text, mimeType: text, sizeBytes: count, storedNew: z.boolean() }),
  }),
  event("evidence_file.downloaded", "evidence_file", { new: obj({ sha256, name: text }) }),
  // The row stays with its bytes; only its link to the run ends.
  event("evidence_file.detached", "evidence_file", {
    old: obj({ run: text, runId: id }),
    new: obj({ reason: text, sha256, name: text, outcome }),
  }),
  event("evidence_file.integrity_failed", "evidence_file", {
    new: obj({ expectedSha256: sha256, actualSha256: sha256.nullable(), name: text }),
  }),
  event("bath_record.created", "bath_record", {
    new: obj({
      tank: text,
      kind: z.enum(BATH_RECORD_KINDS),
      performedAt: isoTime,
      concentrationPct: z.number().nullish(),
      conductivityUsPerCm: z.number().nullish(),
      temperatureC: z.number().nullish(),
      countPerMl4: z.number().nullish(),
      countPerMl6: z.number().nullish(),
      countPerMl14: z.number().nullish(),
      filterDescription: text.nullish(),
      notes: text.nullish(),
      // Since the measurement plan (2026-12): earlier events carry none of these.
      ph: z.number().nullish(),
      oilContentGPerL: z.number().nullish(),
      titrantVolumeMl: z.number().nullish(),
      detergent: text.nullish(),
      titrationFactor: z.number().nullish(),
      additionQuantity: z.number().nullish(),
      additionUnit: text.nullish(),
      additionLot: text.nullish(),
      filterRatingUm: z.number().nullish(),
      differentialPressureBar: z.number().nullish(),
      checkResult: z.enum(CHECK_RESULTS).nullish(),
      photoFileId: id.nullish(),
      limitState: z.enum(BATH_LIMIT_STATES).nullish(),
    }),
  }),
  event("maintenance_interval.set", "maintenance_interval", {
    old: obj({ intervalDays: count, warnDays: count }).nullable().default(null),
    new: obj({ tank: text, kind: z.enum(MAINTENANCE_KINDS), intervalDays: count, warnDays: count }),
  }),
  event("maintenance_interval.reminder_queued", "maintenance_interval", {
    new: obj({ level: z.enum(["due", "overdue"]), dueAt: isoTime, recipients: count }),
  }),
  // Change control
  event("change.opened", "change_request", {
    new: obj({
      number: text,
      title: text,
      kind: z.enum(CHANGE_KINDS),
      recipe: text,
      // None for an initial validation: a new recipe's first version replaces nothing.
      fromVersion: version.nullable(),
      toVersion: version,
      narrativeDocument: text,
    }),
  }),
  event("change.proposal_saved", "change_request", {
    old: obj({
      title: text,
      kind: z.enum(CHANGE_KINDS),
      raisedTo: z.enum(IMPACT_CLASSES).nullable(),
      lockVersion: count,
    }),
    new: obj({
      lockVersion: count,
      title: text,
      kind: z.enum(CHANGE_KINDS),
      raisedTo: z.enum(IMPACT_CLASSES).nullable(),
      computedImpact: z.enum(IMPACT_CLASSES),
      parameters: z.array(obj({ key: text, old: parameterValue, new: parameterValue })),
    }),
  }),
  event("change.impact_assessed", "change_request", {
    old: obj({ status: z.literal("draft") }),
    new: obj({
      status: z.literal("impact_assessed"),
      impact: z.enum(IMPACT_CLASSES),
      computed: z.enum(IMPACT_CLASSES),
      matrixVersion: version.nullable(),
      tests: z.array(text),
      contentHash: sha256,
    }),
  }),
  event("change.reopened", "change_request", {
    old: obj({ status: changeStatus, revision: version }),
    new: obj({ status: z.literal("draft"), revision: version }),
  }),
  event("change.approved", "change_request", {
    old: obj({ status: z.literal("impact_assessed") }),
    new: obj({ status: z.literal("approved_for_implementation"), impact: z.enum(IMPACT_CLASSES) }),
  }),
  event("change.requalification_started", "change_request", {
    old: obj({ status: changeStatus }),
    new: obj({ status: z.literal("requalification") }),
  }),
  event("change.evidence_linked", "change_request", {
    new: obj({ requirement: z.enum(TEST_TYPES), samplesRequired: count, testRun: text }),
  }),
  event("change.verified", "change_request", {
    old: obj({ status: changeStatus }),
    new: obj({ status: z.literal("verified"), evidence: z.array(text) }),
  }),
  event("change.closed", "change_request", {
    old: obj({ status: z.literal("verified") }),
    new: obj({ status: z.literal("closed"), effectiveVersion: version }),
  }),
  event("change.rejected", "change_request", {
    old: obj({ status: changeStatus }),
    new: obj({ status: changeStatus }),
  }),
  event("change.withdrawn", "change_request", {
    old: obj({ status: changeStatus }),
    new: obj({ status: changeStatus }),
  }),
  event("requalification_matrix.versioned", "requalification_matrix", {
    old: obj({ version, removed: z.array(text) })
      .nullable()
      .default(null),
    new: obj({ version, added: z.array(text), rows: count }),
  }),
  // Set by closing a change (the first interval of a validated combination) or changed by hand.
  event("requalification_interval.set", "requalification_interval", {
    old: obj({ intervalMonths: count }).nullable().default(null),
    new: obj({
      intervalMonths: count,
      recipeVersion: version.optional(),
      partFamilyId: id.optional(),
      lastQualifiedAt: isoTime.optional(),
    }),
  }),
  event("requalification_interval.reminder_sent", "requalification_interval", {
    new: obj({
      due: isoTime,
      state: z.enum(["overdue", "due_soon", "not_due"]),
      to: z.array(text),
    }),
  }),
  // Trace and API
  event("audit_pack.exported", "change_request", {
    new: obj({
      number: text,
      format: z.enum(["pdf", "zip"]),
      pdfSha256: sha256,
      bytes: count,
      files: count,
      filesRefused: count.optional(),
    }),
  }),
  event("api_token.created", "api_token", {
    // Tokens expire since 2026-12; earlier events carry no expiry.
    new: obj({
      name: text,
      scope: z.enum(API_TOKEN_SCOPES),
      prefix: text,
      expiresAt: isoTime.optional(),
    }),
  }),
  event("api_token.revoked", "api_token", {
    old: obj({ revokedAt: z.null() }),
    new: obj({ name: text, prefix: text, revokedAt: isoTime }),
  }),
  // Temporary deviations: a time-limited permission to run outside a validated range
  event("deviation.created", "deviation", {
    new: obj({
      number: text,
      recipe: text,
      title: text,
      riskLevel: z.enum(RISK_LEVELS),
      endsOn: isoDate.nullable(),
      maxLots: count.nullable(),
      reminderDays: count,
      partFamilies: z.array(text),
      parameters: z.array(
        obj({
          key: text,
          temporaryLow: z.number().nullable(),
          temporaryHigh: z.number().nullable(),
        }),
      ),
      contentHash: sha256,
    }),
  }),
  event("deviation.approved", "deviation", {
    old: obj({ status: z.literal("draft") }),
    new: obj({ status: z.literal("approved"), contentHash: sha256 }),
  }),
  event("deviation.withdrawn", "deviation", {
    old: obj({ status: z.enum(["draft", "approved"]) }),
    new: obj({ status: z.literal("withdrawn") }),
  }),
  event("deviation.expired", "deviation", {
    old: obj({ status: z.literal("approved") }),
    new: obj({
      status: z.literal("expired"),
      because: z.enum(["end_date", "lots_used"]),
      endsOn: isoDate.nullable(),
      lotsUsed: count,
    }),
  }),
  event("deviation.reminder_sent", "deviation", {
    new: obj({ endsOn: isoDate, daysLeft: count, to: z.array(text) }),
  }),
  event("deviation.lot_recorded", "deviation", {
    new: obj({ lot: text, lotsUsed: count, maxLots: count.nullable() }),
  }),
  event("part_family.picture_set", "part_family", {
    // A first picture has no old one.
    old: obj({ fileId: text, sha256 }).nullable().default(null),
    new: obj({
      fileId: text,
      sha256,
      name: text,
      mimeType: z.enum(["image/png", "image/jpeg"]),
      sizeBytes: z.number().int(),
    }),
  }),
  // Bath chemistry: detergent register, measurement plan, readings beyond their reject limit
  event("detergent.saved", "detergent", {
    old: obj({
      name: text,
      supplier: text.nullable(),
      titrationMethod: text.nullable(),
      factorPctPerMl: z.number(),
    })
      .nullable()
      .default(null),
    new: obj({
      name: text,
      supplier: text.nullable(),
      titrationMethod: text.nullable(),
      factorPctPerMl: z.number(),
    }),
  }),
  event("bath_limit.set", "bath_limit", {
    old: obj({
      recipeVersionId: id,
      target: z.number().nullable(),
      actionLow: z.number().nullable(),
      actionHigh: z.number().nullable(),
      rejectLow: z.number().nullable(),
      rejectHigh: z.number().nullable(),
    })
      .nullable()
      .default(null),
    new: obj({
      tank: text,
      variable: z.enum(BATH_CHEMISTRY_KEYS),
      recipe: text,
      recipeVersionId: id,
      detergent: text.nullable(),
      target: z.number().nullable(),
      actionLow: z.number().nullable(),
      actionHigh: z.number().nullable(),
      rejectLow: z.number().nullable(),
      rejectHigh: z.number().nullable(),
    }),
  }),
  event("bath_record.flagged", "bath_record", {
    new: obj({ tank: text, state: z.enum(BATH_LIMIT_STATES), findings: z.array(text) }),
  }),
  event("evidence_file.check_photo_uploaded", "evidence_file", {
    new: obj({ sha256, name: text, mimeType: text, sizeBytes: count, storedNew: z.boolean() }),
  }),
  // Wash cycles: one event per recording (a form, a washer's log file, an API call), naming its cycles.
  event("wash_cycles.recorded", "wash_cycle_batch", {
    new: obj({
      source: z.enum(["form", "csv", "api"]),
      count,
      /** The first 50 cycle ids; the cycles carry the batch id, so the rest are found by it. */
      cycles: z.array(text),
      flagged: count,
      fileName: text.optional(),
      sha256: sha256.optional(),
    }),
  }),
  // A cycle whose values left the validated range: its own event, so the audit trail lists each one.
  event("wash_cycle.flagged", "wash_cycle", {
    new: obj({ cycleNumber: text, system: text, lots: z.array(text), reasons: z.array(text) }),
  }),
  // Lab details of a test run and its test report
  event("test_run.lab_details_saved", "test_run", {
    old: obj({ details: jsonObject.nullable() }),
    new: obj({ details: jsonObject }),
  }),
  event("test_run.report_exported", "test_run", {
    new: obj({
      format: z.literal("pdf"),
      number: text,
      revision: version,
      contentHash: sha256,
      bytes: count,
    }),
  }),
  // Nonconformances
  event("nonconformance.raised", "nonconformance", {
    new: obj({
      number: text,
      title: text,
      severity: z.enum(NC_SEVERITIES),
      source: z.enum(NC_SOURCE_KINDS),
      sourceLabel: text,
      manualKind: z.enum(NC_MANUAL_KINDS).nullable(),
      detectedOn: isoDate,
      recipe: text.nullable(),
      partFamily: text.nullable(),
      affectedItems: z.array(text),
    }),
  }),
  event("nonconformance.assigned", "nonconformance", {
    old: obj({ owner: text.nullable(), dueOn: isoDate.nullable() }),
    new: obj({ owner: text, dueOn: isoDate.nullable() }),
  }),
  event("nonconformance.item_hold_set", "nonconformance", {
    old: obj({ item: text, hold: z.enum(NC_HOLD_STATES) }),
    new: obj({ item: text, hold: z.enum(NC_HOLD_STATES) }),
  }),
  event("nonconformance.item_disposed", "nonconformance", {
    old: obj({ item: text, disposition: z.enum(NC_DISPOSITIONS).nullable() }),
    new: obj({
      item: text,
      disposition: z.enum(NC_DISPOSITIONS),
      recleanRecipe: text.nullable(),
      concessionReference: text.nullable(),
      concessionFile: sha256.nullable(),
      note: text.nullable(),
    }),
  }),
  event("nonconformance.root_cause_saved", "nonconformance", {
    old: obj({ method: z.enum(NC_CAUSE_METHODS).nullable(), contentHash: sha256.nullable() }),
    new: obj({ method: z.enum(NC_CAUSE_METHODS), contentHash: sha256 }),
  }),
  event("nonconformance.status_changed", "nonconformance", {
    old: obj({ status: z.enum(NC_STATUSES) }),
    new: obj({ status: z.enum(NC_STATUSES) }),
  }),
  event("nonconformance.action_added", "nonconformance", {
    new: obj({
      action: id,
      kind: z.enum(NC_ACTION_KINDS),
      description: text,
      owner: text,
      dueOn: isoDate,
    }),
  }),
  event("nonconformance.action_updated", "nonconformance", {
    old: obj({ action: id, status: z.enum(NC_ACTION_STATUSES), evidenceLink: text.nullable() }),
    new: obj({ action: id, status: z.enum(NC_ACTION_STATUSES), evidenceLink: text.nullable() }),
  }),
  event("nonconformance.change_opened", "nonconformance", {
    new: obj({ action: id, changeRequest: text, joinedOpenChange: z.boolean() }),
  }),
  event("nonconformance.effectiveness_planned", "nonconformance", {
    old: obj({ criterion: text.nullable(), dueOn: isoDate.nullable() }),
    new: obj({ criterion: text, dueOn: isoDate }),
  }),
  event("nonconformance.effectiveness_recorded", "nonconformance", {
    new: obj({
      result: z.enum(NC_EFFECTIVENESS_RESULTS),
      evidenceRun: text.nullable(),
      evidenceFile: sha256.nullable(),
      note: text.nullable(),
    }),
  }),
  event("nonconformance.file_attached", "nonconformance", {
    new: obj({ file: id, name: text, sha256, storedNew: z.boolean() }),
  }),
  event("nonconformance.reminder_sent", "nonconformance", {
    new: obj({
      subject: text,
      dueOn: isoDate,
      level: z.enum(["due", "overdue"]),
      to: z.array(text),
    }),
  }),
  // Change types: emergency changes, affected documents, effectiveness checks
  event("change_control_settings.saved", "change_control_settings", {
    old: obj({ emergencyApprovalDays: count, effectivenessRuns: count }),
    new: obj({ emergencyApprovalDays: count, effectivenessRuns: count }),
  }),
  event("change.emergency_implemented", "change_request", {
    new: obj({
      effectiveVersion: version,
      supersededVersion: version,
      approvalDueOn: isoDate,
      contentHash: sha256,
    }),
  }),
  event("change.emergency_escalated", "change_request", {
    new: obj({ approvalDueOn: isoDate, to: z.array(text) }),
  }),
  event("recipe_version.emergency_reversed", "recipe_version", {
    old: obj({ status: z.literal("effective") }),
    new: obj({ status: z.literal("withdrawn"), effectiveTo: isoTime, changeRequest: text }),
  }),
  event("recipe_version.restored", "recipe_version", {
    old: obj({ status: z.literal("superseded") }),
    new: obj({ status: z.literal("effective"), changeRequest: text }),
  }),
  event("change.document_listed", "change_request", {
    new: obj({ document: text, title: text, entry: id }),
  }),
  event("change.document_confirmed_unaffected", "change_request", {
    old: obj({ unaffectedReason: text.nullable() }),
    new: obj({ document: text, unaffectedReason: text }),
  }),
  event("change.effectiveness_check_opened", "change_request", {
    new: obj({ requiredRuns: count, countsFrom: isoTime }),
  }),
  event("change.effectiveness_confirmed", "change_request", {
    new: obj({ runs: z.array(text), required: count }),
  }),
  event("change.effectiveness_failed", "change_request", {
    new: obj({ runs: z.array(text), required: count, failedRun: text }),
  }),
  event("evidence_file.customer_letter_uploaded", "evidence_file", {
    new: obj({ sha256, name: text, mimeType: text, sizeBytes: count, storedNew: z.boolean() }),
  }),
  // Instruments and calibration
  event("instrument.created", "instrument", { new: instrumentDetails }),
  event("instrument.updated", "instrument", {
    old: instrumentDetails.partial(),
    new: instrumentDetails.partial(),
  }),
  event("instrument.retired", "instrument", {
    old: obj({ status: z.enum(INSTRUMENT_STATUSES) }),
    new: obj({ status: z.literal("retired") }),
  }),
  event("instrument.calibrated", "instrument", {
    old: obj({ dueOn: isoDate.nullable() }),
    new: obj({
      calibrationId: id,
      calibratedOn: isoDate,
      dueOn: isoDate,
      performer: z.enum(CALIBRATION_PERFORMERS),
      performedBy: text,
      certificateNumber: text.nullable(),
      certificateSha256: sha256.nullable(),
      result: z.enum(CALIBRATION_RESULTS),
      note: text.nullable(),
      nonconformance: text.nullable(),
      suspectRuns: z.array(text),
    }),
  }),
  event("instrument.overdue_notice_sent", "instrument", {
    new: obj({ dueOn: isoDate, to: z.array(text) }),
  }),
  event("test_run.instruments_cited", "test_run", {
    old: obj({ instruments: z.array(text) }),
    new: obj({ instruments: z.array(text) }),
  }),
  event("evidence_file.certificate_uploaded", "evidence_file", {
    new: obj({ sha256, name: text, mimeType: text, sizeBytes: count, storedNew: z.boolean() }),
  }),
  event("change.customer_decision_recorded", "change_request", {
    old: obj({ decision: z.enum(["approved", "rejected"]) })
      .nullable()
      .default(null),
    new: obj({
      specification: text,
      decision: z.enum(["approved", "rejected"]),
      decidedOn: isoDate,
      reference: text,
      letterSha256: sha256,
      entry: id,
    }),
  }),
  // Control plans: the routine tests of a qualified combination, and the site's shifts they follow
  event("control_plan.created", "control_plan_version", {
    new: obj({
      combination: text,
      version,
      lines: count,
      contentHash: sha256,
    }),
  }),
  event("control_plan.draft_saved", "control_plan_version", {
    old: obj({ lines: count, contentHash: sha256 }),
    new: obj({ lines: count, contentHash: sha256 }),
  }),
  event("control_plan.revised", "control_plan_version", {
    new: obj({ combination: text, version, fromVersion: version, note: text, contentHash: sha256 }),
  }),
  event("control_plan.status_changed", "control_plan_version", {
    old: obj({ status: z.enum(CONTROL_PLAN_STATUSES) }),
    new: obj({ status: z.enum(CONTROL_PLAN_STATUSES), contentHash: sha256 }),
  }),
  event("control_plan.overdue_notified", "control_plan_line", {
    new: obj({
      characteristic: z.enum(CHARACTERISTICS),
      combination: text,
      dueAt: isoTime,
      to: z.array(text),
    }),
  }),
  event("site.clock_saved", "site", {
    // The first save replaces the defaults, which were never stored.
    old: obj({ timeZone: text, shiftStarts: z.array(text) })
      .nullable()
      .default(null),
    new: obj({ timeZone: text, shiftStarts: z.array(text) }),
  }),
  // Lab methods (versioned, approved) and training
  event("lab_method.drafted", "lab_method", {
    new: obj({
      code: text,
      version,
      kind: z.enum(LAB_METHOD_KINDS),
      name: text,
      details: jsonObject,
      qualificationRun: text.nullable(),
      trainingIntervalMonths: count,
    }),
  }),
  event("lab_method.approved", "lab_method", {
    old: obj({ status: z.literal("draft") }),
    new: obj({ status: z.literal("approved"), contentHash: sha256, supersedes: text.nullable() }),
  }),
  event("lab_method.superseded", "lab_method", {
    old: obj({ status: z.literal("approved") }),
    new: obj({ status: z.literal("superseded"), by: text }),
  }),
  event("test_run.methods_cited", "test_run", {
    old: obj({
      extraction: text.nullable(),
      analysis: text.nullable(),
      gravimetric: text.nullable(),
    }),
    new: obj({
      extraction: text.nullable(),
      analysis: text.nullable(),
      gravimetric: text.nullable(),
    }),
  }),
  event("training.signed_off", "training_record", {
    new: obj({
      person: text,
      method: text,
      trainedOn: isoDate,
      expiresOn: isoDate,
      trainer: text,
      contentHash: sha256,
    }),
  }),
  event("training.procedure_acknowledged", "training_record", {
    new: obj({
      person: text,
      procedure: text,
      trainedOn: isoDate,
      expiresOn: isoDate,
      contentHash: sha256,
    }),
  }),
  event("training.reminder_sent", "training_record", {
    new: obj({ subject: text, expiresOn: isoDate, to: z.array(text) }),
  }),
]);

export type AuditEventInput = z.input<typeof auditEventSchema>;
export type AuditEvent = z.output<typeof auditEventSchema>;
export type AuditEventType = AuditEvent["eventType"];
/** The old or new values of some event, whichever type it is. */
export type AuditValues = NonNullable<AuditEvent["old"] | AuditEvent["new"]>;

export const AUDIT_EVENT_TYPES: readonly AuditEventType[] = auditEventSchema.options.map(
  (o) => o.shape.eventType.value,
);

/** Who did it: a signed-in user, or the system itself (seeding, scheduled jobs). */
export type AuditActor = { id: string; name: string } | { id: null; name: string };
export const SYSTEM_ACTOR: AuditActor = { id: null, name: "system" };
