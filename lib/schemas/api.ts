import { z } from "zod";
import "./messages";
import { calendarDate } from "./date";
import {
  CHANGE_STATUSES,
  IMPACT_CLASSES,
  OUTCOMES,
  PARAMETER_KINDS,
  RECIPE_VERSION_STATUSES,
  RUN_STATUSES,
  SIGNATURE_MEANINGS,
  SPEC_STATUSES,
  STAGE_KINDS,
  STAGE_MODES,
  TEST_TYPES,
  WETTED_AREA_METHODS,
} from "@/db/enums";

/**
 * The /api/v1 contract: query schemas the handlers parse with, and the shapes they
 * answer with. The OpenAPI document is generated from these same schemas.
 * Query schemas are strict, so a misspelt parameter is an error rather than ignored.
 */

/** The schemas the OpenAPI document lists under components, by name. */
export const apiRegistry = z.registry<{ id: string }>();
export function named<T extends z.ZodType>(id: string, schema: T): T {
  apiRegistry.add(schema, { id });
  return schema;
}

const uuid = (what: string) => z.uuid(`${what} must be a UUID.`);

export const pageQuery = z
  .object({
    limit: z.coerce
      .number()
      .int("limit must be a whole number.")
      .min(1, "limit must be at least 1.")
      .max(200, "limit must be at most 200.")
      .default(50)
      .describe("Items per page, 1–200."),
    cursor: z.string().min(1).max(500).optional().describe("nextCursor from the previous page."),
  })
  .strict();

export const recipesQuery = pageQuery
  .extend({
    systemId: uuid("systemId").optional().describe("Only this cleaning system's recipes."),
  })
  .strict();
export const partFamiliesQuery = pageQuery
  .extend({
    specCode: z
      .string()
      .trim()
      .min(1)
      .max(60)
      .optional()
      .describe("Only the families under this specification (its register code)."),
  })
  .strict();
export const specificationsQuery = pageQuery
  .extend({
    status: z
      .enum(SPEC_STATUSES)
      .optional()
      .describe("in_force for the revisions runs are judged by now; superseded for earlier ones."),
  })
  .strict();
export const qualifiedCombinationsQuery = pageQuery
  .extend({
    partFamilyId: uuid("partFamilyId").optional(),
    recipeId: uuid("recipeId").optional(),
  })
  .strict();
export const changeRequestsQuery = pageQuery
  .extend({
    status: z.enum(CHANGE_STATUSES).optional(),
    recipeId: uuid("recipeId").optional(),
  })
  .strict();
export const testRunsQuery = pageQuery
  .extend({
    changeRequestId: uuid("changeRequestId").optional(),
    recipeVersionId: uuid("recipeVersionId").optional(),
    partFamilyId: uuid("partFamilyId").optional(),
    testType: z.enum(TEST_TYPES).optional(),
  })
  .strict();
export const auditEventsQuery = pageQuery
  .extend({
    actor: z.string().trim().max(64).optional().describe('A user id, or "system".'),
    recordType: z.string().trim().max(40).optional(),
    recordId: z.string().trim().max(100).optional(),
    eventType: z
      .string()
      .trim()
      .max(60)
      .optional()
      .describe(
        "An audit event type, e.g. change.closed; also finds events stored under an earlier name of the type.",
      ),
    from: calendarDate().optional(),
    to: calendarDate().optional(),
  })
  .strict();

// ── Answers ───────────────────────────────────────────────────────────────

const iso = z.string().describe("ISO-8601 UTC");
const nullableIso = iso.nullable();

export const errorOut = named(
  "Error",
  z.object({
    error: z.string().describe("What went wrong, in words a person can act on"),
    fieldErrors: z.record(z.string(), z.array(z.string())).optional(),
  }),
);

export const cleaningSystemOut = named(
  "CleaningSystem",
  z.object({
    id: z.string(),
    code: z.string(),
    name: z.string(),
    kind: z.string(),
    assetNumber: z.string().nullable().describe("The plant's own asset register number"),
    description: z.string().nullable(),
    active: z.boolean(),
    retiredAt: nullableIso,
    retireReason: z.string().nullable(),
    site: z.string(),
    stages: z.array(
      z.object({
        position: z.number().int().describe("Place in the process order, from 1"),
        name: z.string(),
        kind: z.enum(STAGE_KINDS),
        capabilities: z.array(z.enum(STAGE_MODES)),
        tankVolumeL: z.number().nullable(),
        filterRatingUm: z.number().nullable(),
        ultrasonicPowerW: z.number().nullable(),
        ultrasonicFrequencyKHz: z.number().nullable(),
        sprayPressureBar: z.number().nullable(),
        injectionPressureBar: z.number().nullable(),
        nozzleSet: z.string().nullable(),
      }),
    ),
  }),
);

const versionSummary = z.object({
  id: z.string(),
  version: z.number().int(),
  status: z.enum(RECIPE_VERSION_STATUSES),
  effectiveFrom: nullableIso,
  effectiveTo: nullableIso,
});

export const recipeOut = named(
  "Recipe",
  z.object({
    id: z.string(),
    code: z.string(),
    name: z.string(),
    description: z.string().nullable(),
    systemId: z.string(),
    systemCode: z.string(),
    systemAssetNumber: z.string().nullable(),
    systemRetired: z
      .boolean()
      .describe("The cleaning system is retired: the recipe can no longer run"),
    versions: z.array(versionSummary),
  }),
);

export const parameterOut = z.object({
  key: z.string().describe('Stable across versions, e.g. "wash.temperature".'),
  name: z.string(),
  kind: z.enum(PARAMETER_KINDS),
  setpoint: z.number(),
  unit: z.string(),
  validatedLow: z.number().nullable(),
  validatedHigh: z.number().nullable(),
  critical: z.boolean(),
});

export const recipeVersionOut = named(
  "RecipeVersion",
  versionSummary.extend({
    recipeId: z.string(),
    recipeCode: z.string(),
    detergent: z.string().nullable(),
    notes: z.string().nullable(),
    stages: z.array(
      z.object({
        position: z.number().int(),
        name: z.string(),
        kind: z.string(),
        mode: z.string().nullable(),
        parameters: z.array(parameterOut),
      }),
    ),
  }),
);

export const specificationOut = named(
  "Specification",
  z.object({
    id: z.string().describe("One revision: a new revision is a new record"),
    code: z.string().describe("The register code, the same across revisions"),
    name: z.string(),
    customer: z.string().nullable(),
    documentNumber: z.string().nullable(),
    revision: z.string(),
    status: z.enum(SPEC_STATUSES),
    supersedesId: z.string().nullable(),
    supersededAt: nullableIso,
    ccc: z.string().describe("Cleanliness code; prefix A is per 1000 cm², N per component"),
    maxMetallicUm: z.number().nullable(),
    maxNonMetallicUm: z.number().nullable(),
    maxFibreUm: z.number().nullable(),
    gravimetricLimitMg: z.number().nullable(),
    gravimetricBasis: z.enum(["per_component", "per_1000_cm2"]).nullable(),
    minWettingTensionMNm: z.number().nullable(),
    visualCriteria: z.string().nullable(),
    drynessCriteria: z.string().nullable(),
    extraRequirements: z.string().nullable(),
    customerApprovesChanges: z.boolean(),
    sourceFileSha256: z
      .string()
      .nullable()
      .describe("SHA-256 of the customer's document as uploaded"),
    createdAt: iso,
  }),
);

export const partFamilyOut = named(
  "PartFamily",
  z.object({
    id: z.string(),
    code: z.string(),
    name: z.string(),
    partNumbers: z.array(z.string()),
    material: z.string(),
    wettedAreaCm2: z.number(),
    wettedAreaMethod: z.enum(WETTED_AREA_METHODS).nullable(),
    wettedAreaNote: z.string().nullable(),
    drawingNumber: z.string().nullable(),
    drawingRevision: z.string().nullable(),
    customer: z.string().nullable(),
    description: z.string().nullable(),
    specId: z.string().describe("The specification revision in force for the family"),
    specCode: z.string(),
    specRevision: z.string(),
  }),
);

export const qualifiedCombinationOut = named(
  "QualifiedCombination",
  z.object({
    id: z.string(),
    partFamilyId: z.string(),
    partFamilyCode: z.string(),
    recipeId: z.string(),
    recipeCode: z.string(),
    recipeVersionId: z.string(),
    recipeVersion: z.number().int(),
    recipeVersionStatus: z.enum(RECIPE_VERSION_STATUSES),
    lastQualifiedAt: iso,
    intervalMonths: z.number().int(),
    dueOn: z.string().describe("Calendar date (UTC) by which the combination must be requalified"),
    basis: z
      .string()
      .nullable()
      .describe("What proves the qualification, in words; null when carried over by a change"),
  }),
);

export const signatureOut = named(
  "Signature",
  z.object({
    printedName: z.string(),
    meaning: z.enum(SIGNATURE_MEANINGS),
    signedAt: iso,
    contentHash: z.string().describe("SHA-256 of exactly the content signed"),
  }),
);

export const changeRequestOut = named(
  "ChangeRequest",
  z.object({
    id: z.string(),
    number: z.string(),
    title: z.string(),
    status: z.enum(CHANGE_STATUSES),
    impact: z.enum(IMPACT_CLASSES).nullable(),
    recipeId: z.string(),
    recipeCode: z.string(),
    fromVersion: z.number().int().nullable(),
    toVersion: z.number().int().nullable(),
    createdAt: iso,
    closedAt: nullableIso,
  }),
);

export const changeRequestDetailOut = named(
  "ChangeRequestDetail",
  changeRequestOut.extend({
    justification: z.string(),
    parameterChanges: z.array(
      z.object({
        key: z.string(),
        name: z.string(),
        stage: z.string(),
        change: z.enum(["unchanged", "changed", "added", "removed"]),
        old: parameterOut.nullable(),
        new: parameterOut.nullable(),
        position: z
          .enum(["inside", "outside"])
          .nullable()
          .describe("The new setpoint against the old validated range"),
        impact: z.enum(IMPACT_CLASSES),
        reasons: z.array(z.string()),
      }),
    ),
    requiredTests: z.array(
      z.object({
        testType: z.enum(TEST_TYPES),
        samples: z.number().int(),
        confidencePct: z.number(),
        reliabilityPct: z.number(),
      }),
    ),
    signatures: z.array(signatureOut.extend({ revision: z.number().int() })),
    evidenceRunIds: z.array(z.string()),
  }),
);

export const testRunOut = named(
  "TestRun",
  z.object({
    id: z.string(),
    number: z.string(),
    revision: z.number().int(),
    testType: z.enum(TEST_TYPES),
    status: z.enum(RUN_STATUSES),
    outcome: z.enum(OUTCOMES).nullable().describe("Computed from the stored samples, never typed"),
    partFamilyId: z.string(),
    partFamilyCode: z.string(),
    recipeVersionId: z.string(),
    changeRequestId: z.string().nullable(),
    lab: z.string().nullable(),
    performedOn: z.string().nullable(),
    createdAt: iso,
  }),
);

export const testRunDetailOut = named(
  "TestRunDetail",
  testRunOut.extend({
    runData: z
      .record(z.string(), z.unknown())
      .nullable()
      .describe(
        "Run-level raw data: a particle test's extraction series and blank, null until recorded",
      ),
    samples: z.array(
      z.object({
        id: z.string(),
        sampleLabel: z.string(),
        cycleNumber: z.string().nullable().describe("The wash cycle the part came out of."),
        basketPosition: z.string().nullable(),
        worstCase: z.boolean(),
        data: z.record(z.string(), z.unknown()),
      }),
    ),
    files: z.array(
      z.object({
        id: z.string(),
        originalName: z.string(),
        mimeType: z.string(),
        sizeBytes: z.number().int(),
        sha256: z.string(),
      }),
    ),
    signatures: z.array(signatureOut),
    labDetails: z
      .record(z.string(), z.unknown())
      .nullable()
      .describe(
        "Extraction, filter, analysis and component data as recorded (the body of POST …/lab-details), or null",
      ),
  }),
);

export const auditEventOut = named(
  "AuditEvent",
  z.object({
    seq: z.number().int(),
    at: iso,
    actorName: z.string(),
    eventType: z.string().describe("Today's name of the event type"),
    storedEventType: z
      .string()
      .describe(
        "The name stored with the event, which its hash covers (an earlier name of the type for older events)",
      ),
    recordType: z.string(),
    recordId: z.string(),
    old: z
      .record(z.string(), z.unknown())
      .nullable()
      .describe("Old values exactly as stored and hashed (canonical JSON)"),
    new: z
      .record(z.string(), z.unknown())
      .nullable()
      .describe("New values exactly as stored and hashed (canonical JSON)"),
    reason: z.string().nullable(),
    prevHash: z.string(),
    hash: z.string(),
  }),
);

export function pageOf<T extends z.ZodType>(id: string, item: T) {
  return named(
    id,
    z.object({
      data: z.array(item),
      nextCursor: z
        .string()
        .nullable()
        .describe("Pass as cursor for the next page; null on the last page."),
    }),
  );
}
export const cleaningSystemPage = pageOf("CleaningSystemPage", cleaningSystemOut);
export const recipePage = pageOf("RecipePage", recipeOut);
export const partFamilyPage = pageOf("PartFamilyPage", partFamilyOut);
export const specificationPage = pageOf("SpecificationPage", specificationOut);
export const qualifiedCombinationPage = pageOf("QualifiedCombinationPage", qualifiedCombinationOut);
export const changeRequestPage = pageOf("ChangeRequestPage", changeRequestOut);
export const testRunPage = pageOf("TestRunPage", testRunOut);
export const auditEventPage = pageOf("AuditEventPage", auditEventOut);

export type CleaningSystemOut = z.infer<typeof cleaningSystemOut>;
export type RecipeOut = z.infer<typeof recipeOut>;
export type PartFamilyOut = z.infer<typeof partFamilyOut>;
export type SpecificationOut = z.infer<typeof specificationOut>;
export type QualifiedCombinationOut = z.infer<typeof qualifiedCombinationOut>;
export type RecipeVersionOut = z.infer<typeof recipeVersionOut>;
export type ChangeRequestOut = z.infer<typeof changeRequestOut>;
export type ChangeRequestDetailOut = z.infer<typeof changeRequestDetailOut>;
export type TestRunOut = z.infer<typeof testRunOut>;
export type TestRunDetailOut = z.infer<typeof testRunDetailOut>;
export type AuditEventOut = z.infer<typeof auditEventOut>;

export const sampleAddedOut = named(
  "SampleAdded",
  z.object({ sampleId: z.string(), run: testRunDetailOut }),
);

export const bathReadingOut = named(
  "BathReadingRecorded",
  z.object({
    id: z.string(),
    stageId: z.string(),
    kind: z.string(),
    performedAt: z.string().describe("UTC"),
    concentrationPct: z
      .number()
      .nullable()
      .describe("Entered, or computed from the titrant volume × the detergent's factor"),
    limitState: z
      .enum(["ok", "action", "reject"])
      .nullable()
      .describe(
        "Against the tank's measurement plan; null when the tank has no plan line for the values",
      ),
    findings: z.array(z.string()).describe("One sentence per value beyond a limit"),
  }),
);

export const fileAttachedOut = named(
  "FileAttached",
  z.object({
    fileId: z.string(),
    sha256: z.string(),
    created: z
      .boolean()
      .describe("False when these bytes were already stored (for another run); they are kept once"),
    run: testRunDetailOut,
  }),
);
