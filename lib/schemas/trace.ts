import { z } from "zod";
import "./messages";

/**
 * The trace page's query string: which recipe parameter to show, and the chooser's filter.
 * Anything else is ignored, not an error.
 */
export const traceQuerySchema = z.object({
  recipe: z.uuid().optional().catch(undefined),
  key: z
    .string()
    .trim()
    .regex(/^[a-z0-9_.]{1,80}$/)
    .optional()
    .catch(undefined),
  /** How many of the newest timeline entries to show; the "older entries" link raises it. */
  entries: z.coerce.number().int().min(1).max(10_000).optional().catch(undefined),
  /** The chooser's own filter, kept in the address so a reload or a shared link keeps it. */
  system: z.uuid().optional().catch(undefined),
  inRecipe: z.uuid().optional().catch(undefined),
  q: z.string().trim().max(80).optional().catch(undefined),
});

/** Timeline entries a trace shows at first, newest first; each "older entries" link adds as many. */
export const TRACE_ENTRIES_PAGE = 10;

export const partFamilyQuerySchema = z.object({ family: z.uuid().optional().catch(undefined) });

export const auditPackQuerySchema = z
  .object({
    format: z.enum(["pdf", "zip"], { error: 'Ask for format "pdf" or "zip".' }).default("pdf"),
  })
  .strict();

/** The trace search's query string; unlike the page's, a bad value is an error the caller sees. */
export const parameterSearchQuerySchema = z
  .object({
    system: z.union([z.uuid("Choose a cleaning system from the list."), z.literal("")]).optional(),
    recipe: z.union([z.uuid("Choose a recipe from the list."), z.literal("")]).optional(),
    q: z.string().max(200, "Search with 200 characters at most.").optional(),
  })
  .strict();

/** The recipe chooser's query string: the cleaning system whose recipes it offers. */
export const traceRecipesQuerySchema = z
  .object({ system: z.uuid("Choose a cleaning system from the list.") })
  .strict();
