import { z } from "zod";
import {
  apiRegistry,
  auditEventPage,
  auditEventsQuery,
  bathReadingOut,
  fileAttachedOut,
  changeRequestDetailOut,
  changeRequestPage,
  changeRequestsQuery,
  cleaningSystemPage,
  pageQuery,
  partFamiliesQuery,
  partFamilyPage,
  qualifiedCombinationPage,
  qualifiedCombinationsQuery,
  recipeOut,
  recipePage,
  recipesQuery,
  recipeVersionOut,
  sampleAddedOut,
  specificationPage,
  specificationsQuery,
  testRunDetailOut,
  testRunPage,
  testRunsQuery,
} from "@/lib/schemas/api";
import { V1_ENDPOINTS } from "@/lib/api/v1-routes";
import { EVIDENCE_FILE_KINDS } from "@/db/enums";
import { cycleBatchSchema, cyclePage, cyclesQuery, cyclesRecordedOut } from "@/lib/schemas/cycle";
import { instrumentPage, instrumentsQuery } from "@/lib/schemas/instrument-api";
import {
  bathRecordSchema,
  conductivitySampleSchema,
  createRunSchema,
  particleRunDataApiSchema,
  gravimetricSampleSchema,
  observationSampleSchema,
  particleSampleSchema,
  wettingSampleSchema,
} from "@/lib/schemas/evidence";
import { labDetailsSchema } from "@/lib/schemas/lab-details";

export interface ApiOperation {
  method: "get" | "post";
  path: string;
  operationId: string;
  summary: string;
  pathParams?: Record<string, { description: string; schema: Record<string, unknown> }>;
  query?: z.ZodObject;
  body?: z.ZodType;
  /** A multipart form instead of JSON (a file upload), as a JSON Schema of its fields. */
  multipart?: Record<string, unknown>;
  /** The JSON answer's schema, or "pdf" for a file download (a test report). */
  response: z.ZodType | "pdf";
  status?: number;
  errors: number[];
}

/** The route file that serves an operation, as the endpoint registry names it. */
export function endpointKey(op: Pick<ApiOperation, "method" | "path">): string {
  return `${op.method.toUpperCase()} app/api/v1${op.path.replace(/\{(\w+)\}/g, "[$1]")}/route.ts`;
}

/** Who may call an operation is what its route handler declared (apiRoute), which the authorisation tests hold it to. */
function accessText(op: ApiOperation): string {
  const rule = V1_ENDPOINTS[endpointKey(op)];
  if (rule?.auth !== "token")
    throw new Error(`${endpointKey(op)} declares no token rule (apiRoute)`);
  return `Allowed to the roles that may "${rule.permission}" in the role table${rule.scope === "read_write" ? ", with a read-and-write token" : ""}.`;
}

const uuidParam = (description: string) => ({
  description,
  schema: { type: "string", format: "uuid" },
});

/** Every /api/v1 operation; the route handlers parse with the same schemas. */
export const API_OPERATIONS: ApiOperation[] = [
  {
    method: "get",
    path: "/cleaning-systems",
    operationId: "listCleaningSystems",
    summary: "Cleaning systems with their stages",
    query: pageQuery,
    response: cleaningSystemPage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/recipes",
    operationId: "listRecipes",
    summary: "Recipes with their versions",
    query: recipesQuery,
    response: recipePage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/recipes/{recipeId}",
    operationId: "getRecipe",
    summary: "One recipe with its versions",
    pathParams: { recipeId: uuidParam("Recipe id") },
    response: recipeOut,
    errors: [401, 403, 404],
  },
  {
    method: "get",
    path: "/recipes/{recipeId}/versions/{version}",
    operationId: "getRecipeVersion",
    summary: "One recipe version: stages and parameters with setpoints and validated ranges",

    pathParams: {
      recipeId: uuidParam("Recipe id"),
      version: { description: "Version number", schema: { type: "integer", minimum: 1 } },
    },
    response: recipeVersionOut,
    errors: [401, 403, 404],
  },
  {
    method: "get",
    path: "/part-families",
    operationId: "listPartFamilies",
    summary: "Part families with the specification revision in force for each",
    query: partFamiliesQuery,
    response: partFamilyPage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/specifications",
    operationId: "listSpecifications",
    summary: "Customer cleanliness specifications, one record per revision",
    query: specificationsQuery,
    response: specificationPage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/qualified-combinations",
    operationId: "listQualifiedCombinations",
    summary:
      "Which recipe version is validated for which part family, and when it is due for requalification",
    query: qualifiedCombinationsQuery,
    response: qualifiedCombinationPage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/change-requests",
    operationId: "listChangeRequests",
    summary: "Change requests",
    query: changeRequestsQuery,
    response: changeRequestPage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/change-requests/{changeRequestId}",
    operationId: "getChangeRequest",
    summary:
      "One change request: justification, parameter changes, required tests, signatures and evidence",

    pathParams: { changeRequestId: uuidParam("Change request id") },
    response: changeRequestDetailOut,
    errors: [401, 403, 404],
  },
  {
    method: "get",
    path: "/test-runs",
    operationId: "listTestRuns",
    summary: "Test runs with their computed outcomes",
    query: testRunsQuery,
    response: testRunPage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/test-runs/{runId}",
    operationId: "getTestRun",
    summary: "One test run: raw data per sample, files with their SHA-256, signatures",

    pathParams: { runId: uuidParam("Test run id") },
    response: testRunDetailOut,
    errors: [401, 403, 404],
  },
  {
    method: "get",
    path: "/test-runs/{runId}/report",
    operationId: "getTestReport",
    summary:
      "The run's test report as a PDF: component, extraction, filter, analysis, counts per size class, largest particles, evaluation against the specification revision in force, signatures with the content hash; the export is audited",
    pathParams: { runId: uuidParam("Test run id") },
    response: "pdf",
    errors: [401, 403, 404, 503],
  },
  {
    method: "post",
    path: "/test-runs/{runId}/lab-details",
    operationId: "saveTestRunLabDetails",
    summary:
      "Record how an open particle run was extracted and analysed and on which parts (replaces what was recorded); part of the run's signed content",
    pathParams: { runId: uuidParam("Test run id (the run must be open)") },
    body: labDetailsSchema,
    response: testRunDetailOut,
    errors: [400, 401, 403, 404, 415, 422, 423, 503],
  },
  {
    method: "post",
    path: "/test-runs",
    operationId: "openTestRun",
    summary:
      "Open a test run: part family, recipe version, test type, technician, lab and date; samples, series and files follow",
    body: createRunSchema.describe(
      "As the New test run form: the combination must be qualified, or being qualified by the change request or protocol named",
    ),
    response: testRunDetailOut,
    status: 201,
    errors: [400, 401, 403, 409, 413, 415, 422, 503],
  },
  {
    method: "post",
    path: "/test-runs/{runId}/extraction-series",
    operationId: "saveExtractionSeries",
    summary:
      "Record a particle run's extraction series and blank; posting again replaces them, and the outcome is recomputed",
    pathParams: { runId: uuidParam("Test run id (an open particle cleanliness run)") },
    body: particleRunDataApiSchema,
    response: testRunDetailOut,
    errors: [400, 401, 403, 404, 413, 415, 422, 423, 503],
  },
  {
    method: "post",
    path: "/test-runs/{runId}/files",
    operationId: "attachTestRunFile",
    summary:
      "Attach one file to an open run: checked for what it is, stored once under its SHA-256, audited",
    pathParams: { runId: uuidParam("Test run id (the run must be open)") },
    multipart: {
      type: "object",
      required: ["file", "kind"],
      additionalProperties: false,
      properties: {
        file: { type: "string", contentMediaType: "application/octet-stream" },
        kind: { type: "string", enum: [...EVIDENCE_FILE_KINDS] },
        sampleLabel: {
          type: "string",
          maxLength: 60,
          description: "The sample a photo or membrane image shows",
        },
      },
    },
    response: fileAttachedOut,
    status: 201,
    errors: [400, 401, 403, 404, 409, 413, 415, 422, 423, 503],
  },
  {
    method: "post",
    path: "/test-runs/{runId}/samples",
    operationId: "addTestSample",
    summary:
      "Add one sample's raw data to an open run; the outcome is recomputed from the stored samples",

    pathParams: { runId: uuidParam("Test run id (the run must be open)") },
    body: z
      .union([
        particleSampleSchema,
        gravimetricSampleSchema,
        wettingSampleSchema,
        conductivitySampleSchema,
        observationSampleSchema,
      ])
      .describe(
        "The sample schema of the run's test type, in this order: particle cleanliness, gravimetric, wetting tension, rinse conductivity, visual / UV / dryness",
      ),
    response: sampleAddedOut,
    status: 201,
    errors: [400, 401, 403, 404, 409, 415, 422, 423, 503],
  },
  {
    method: "get",
    path: "/cycles",
    operationId: "listCycles",
    summary: "Wash cycles, newest first: by washer, lot or flag",
    query: cyclesQuery,
    response: cyclePage,
    errors: [400, 401, 403],
  },
  {
    method: "get",
    path: "/instruments",
    operationId: "listInstruments",
    summary:
      "The instrument register by asset number: kind, location, status and calibration standing (a test-ink set by its expiry date)",
    query: instrumentsQuery,
    response: instrumentPage,
    errors: [400, 401, 403],
  },
  {
    method: "post",
    path: "/cycles",
    operationId: "recordCycles",
    summary:
      "Record wash cycles from a washer's feed: one cycle, or { cycles: [...] } up to 1,000, all or none. The recipe version must be in force at each start and the part family qualified on it; values outside their validated range flag the cycle",
    body: cycleBatchSchema,
    response: cyclesRecordedOut,
    status: 201,
    errors: [400, 401, 403, 413, 415, 422, 503],
  },
  {
    method: "get",
    path: "/audit-events",
    operationId: "listAuditEvents",
    summary: "The audit trail, newest first",
    query: auditEventsQuery,
    response: auditEventPage,
    errors: [400, 401, 403],
  },
  {
    method: "post",
    path: "/bath-readings",
    operationId: "recordBathReading",
    summary:
      "Record a bath reading (or another bath-log entry) for a tank; a titrant volume is turned into a concentration with the detergent's factor, and the reading is graded against the tank's action and reject limits",
    body: bathRecordSchema,
    response: bathReadingOut,
    status: 201,
    errors: [400, 401, 403, 404, 413, 415, 422, 503],
  },
];

const ERROR_TEXT: Record<number, string> = {
  400: "Malformed request: bad JSON, query parameter or cursor",
  401: "No token, an unknown token, or a revoked one",
  403: "The token's scope or the owner's roles do not allow this",
  404: "No such record",
  409: "The record's state does not allow this (e.g. the sample is already recorded)",
  413: "The body or file is larger than the limit the message names; nothing was stored",
  415: "The body is not JSON (or, for a file, not a multipart form)",
  422: "The body breaks the schema: wrong type, missing or unknown field",
  423: "The run is signed and locked: correct it through a new revision",
  503: "The database is busy or read-only; nothing was changed, try again later",
};

/** A JSON Schema for embedding in the document: the dialect is the document's, not repeated per schema. */
function embedded(schema: z.ZodType, io: "input" | "output") {
  const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, {
    io,
    target: "draft-2020-12",
    unrepresentable: "any",
  }) as Record<string, unknown>;
  return rest;
}

/** The OpenAPI 3.1 description of /api/v1, generated from the zod schemas. */
export function buildOpenApiDocument(serverUrl = "/api/v1") {
  const ref = (schema: z.ZodType) => {
    const id = apiRegistry.get(schema)?.id;
    return id ? { $ref: `#/components/schemas/${id}` } : embedded(schema, "output");
  };
  const components = z.toJSONSchema(apiRegistry, {
    target: "draft-2020-12",
    uri: (id) => `#/components/schemas/${id}`,
  }).schemas;
  // Components are named by their key; a per-schema $id or $schema would only confuse tools.
  for (const schema of Object.values(components)) {
    delete (schema as { $schema?: string }).$schema;
    delete (schema as { $id?: string }).$id;
  }

  const paths: Record<string, Record<string, unknown>> = {};
  for (const op of API_OPERATIONS) {
    const parameters: unknown[] = Object.entries(op.pathParams ?? {}).map(([name, p]) => ({
      name,
      in: "path",
      required: true,
      ...p,
    }));
    if (op.query) {
      const json = z.toJSONSchema(op.query, { io: "input", target: "draft-2020-12" }) as {
        properties?: Record<string, Record<string, unknown>>;
        required?: string[];
      };
      for (const [name, schema] of Object.entries(json.properties ?? {})) {
        const { description, ...rest } = schema;
        parameters.push({
          name,
          in: "query",
          required: (json.required ?? []).includes(name) && !("default" in schema),
          ...(description ? { description } : {}),
          schema: rest,
        });
      }
    }
    const responses: Record<string, unknown> = {
      [String(op.status ?? 200)]: {
        description: "OK",
        content:
          op.response === "pdf"
            ? { "application/pdf": { schema: { type: "string", format: "binary" } } }
            : { "application/json": { schema: ref(op.response) } },
      },
    };
    for (const code of op.errors)
      responses[String(code)] = {
        description: ERROR_TEXT[code],
        content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } },
      };
    (paths[op.path] ??= {})[op.method] = {
      operationId: op.operationId,
      summary: op.summary,
      description: accessText(op),
      parameters,
      ...(op.body
        ? {
            requestBody: {
              required: true,
              content: { "application/json": { schema: embedded(op.body, "input") } },
            },
          }
        : op.multipart
          ? {
              requestBody: {
                required: true,
                content: { "multipart/form-data": { schema: op.multipart } },
              },
            }
          : {}),
      responses,
    };
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "Washproof API",
      version: "1",
      description:
        "Read cleaning systems, recipes and their versions, change requests, test runs and the audit trail; instruments open test runs and post their samples, extraction series and files. Authenticate with a personal API token (Account → API tokens) as `Authorization: Bearer wpk_…`. A token acts with its owner's roles; a read token never writes. Lists are paged with `limit` and `cursor` (pass back `nextCursor`). Unknown query parameters and body fields are refused.",
    },
    servers: [{ url: serverUrl }],
    security: [{ bearerAuth: [] }],
    paths,
    components: {
      securitySchemes: {
        bearerAuth: { type: "http", scheme: "bearer", description: "A personal API token, wpk_…" },
      },
      schemas: components,
    },
  };
}
