import { z } from "zod";
import "./messages";
import { calendarDate } from "./date";
import { OUTCOMES, TEST_TYPES } from "@/db/enums";

const optional = <T extends z.ZodType>(schema: T) =>
  z.preprocess((v) => (v === "" || v === null ? undefined : v), schema.optional());

/** The evidence list's query string: filters, sort and page, parsed on the server. */
export const evidenceListQuerySchema = z.object({
  partFamilyId: optional(z.string().uuid("Unknown part family.")),
  recipeVersionId: optional(z.string().uuid("Unknown recipe version.")),
  recipeId: optional(z.string().uuid("Unknown recipe.")),
  /** A version number of the chosen recipe. */
  version: optional(
    z.coerce
      .number({ error: "Enter a version number." })
      .int("Enter a whole version number.")
      .min(1, "Versions are numbered from 1.")
      .max(100_000, "Enter a version number of the recipe."),
  ),
  testType: optional(z.enum(TEST_TYPES)),
  outcome: optional(z.enum(OUTCOMES)),
  from: optional(calendarDate()),
  to: optional(calendarDate()),
  includeSuperseded: optional(z.enum(["true", "false"])).transform((v) => v === "true"),
  sort: z
    .enum(["number", "performedOn", "partFamily", "testType", "outcome", "status"])
    .default("performedOn"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(5).max(100).default(20),
});
export type EvidenceListQuery = z.output<typeof evidenceListQuerySchema>;

export interface EvidenceListRow {
  id: string;
  number: string;
  revision: number;
  partFamily: string;
  recipe: string;
  testType: (typeof TEST_TYPES)[number];
  status: string;
  outcome: (typeof OUTCOMES)[number] | null;
  performedOn: string | null;
  technician: string | null;
  lab: string | null;
}

export interface EvidenceListPage {
  rows: EvidenceListRow[];
  total: number;
  page: number;
  pageSize: number;
}

/** `GET /api/evidence/protocols`: the protocols a run on one part family and recipe version can execute. */
export const runProtocolsQuerySchema = z
  .object({
    partFamily: z.uuid("Choose the part family."),
    recipeVersion: z.uuid("Choose the recipe version."),
  })
  .strict();

/** `?partFamily=` of GET /api/evidence/family-versions. */
export const familyVersionsQuerySchema = z
  .object({ partFamily: z.uuid("Choose the part family.") })
  .strict();
