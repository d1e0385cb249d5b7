import "server-only";
import { rulesOf, type EndpointRule } from "@/lib/auth/endpoint-rule";
import * as apiV1AuditEventsRoute from "@/app/api/v1/audit-events/route";
import * as apiV1BathReadingsRoute from "@/app/api/v1/bath-readings/route";
import * as apiV1ChangeRequestsChangerequestidRoute from "@/app/api/v1/change-requests/[changeRequestId]/route";
import * as apiV1ChangeRequestsRoute from "@/app/api/v1/change-requests/route";
import * as apiV1CleaningSystemsRoute from "@/app/api/v1/cleaning-systems/route";
import * as apiV1CyclesRoute from "@/app/api/v1/cycles/route";
import * as apiV1InstrumentsRoute from "@/app/api/v1/instruments/route";
import * as apiV1PartFamiliesRoute from "@/app/api/v1/part-families/route";
import * as apiV1QualifiedCombinationsRoute from "@/app/api/v1/qualified-combinations/route";
import * as apiV1RecipesRecipeidRoute from "@/app/api/v1/recipes/[recipeId]/route";
import * as apiV1RecipesRecipeidVersionsVersionRoute from "@/app/api/v1/recipes/[recipeId]/versions/[version]/route";
import * as apiV1RecipesRoute from "@/app/api/v1/recipes/route";
import * as apiV1SpecificationsRoute from "@/app/api/v1/specifications/route";
import * as apiV1TestRunsRunidExtractionSeriesRoute from "@/app/api/v1/test-runs/[runId]/extraction-series/route";
import * as apiV1TestRunsRunidFilesRoute from "@/app/api/v1/test-runs/[runId]/files/route";
import * as apiV1TestRunsRunidSamplesRoute from "@/app/api/v1/test-runs/[runId]/samples/route";
import * as apiV1TestRunsRunidRoute from "@/app/api/v1/test-runs/[runId]/route";
import * as apiV1TestRunsRunidLabDetailsRoute from "@/app/api/v1/test-runs/[runId]/lab-details/route";
import * as apiV1TestRunsRunidReportRoute from "@/app/api/v1/test-runs/[runId]/report/route";
import * as apiV1TestRunsRoute from "@/app/api/v1/test-runs/route";

/**
 * The token-authenticated /api/v1 routes, each module under its file. The OpenAPI description reads
 * their access from here; kept apart from the full registry so the description's own route does not
 * import itself.
 */
export const V1_ROUTE_MODULES: Record<string, Record<string, unknown>> = {
  "app/api/v1/audit-events/route.ts": apiV1AuditEventsRoute,
  "app/api/v1/bath-readings/route.ts": apiV1BathReadingsRoute,
  "app/api/v1/change-requests/[changeRequestId]/route.ts": apiV1ChangeRequestsChangerequestidRoute,
  "app/api/v1/change-requests/route.ts": apiV1ChangeRequestsRoute,
  "app/api/v1/cleaning-systems/route.ts": apiV1CleaningSystemsRoute,
  "app/api/v1/cycles/route.ts": apiV1CyclesRoute,
  "app/api/v1/instruments/route.ts": apiV1InstrumentsRoute,
  "app/api/v1/part-families/route.ts": apiV1PartFamiliesRoute,
  "app/api/v1/qualified-combinations/route.ts": apiV1QualifiedCombinationsRoute,
  "app/api/v1/recipes/[recipeId]/route.ts": apiV1RecipesRecipeidRoute,
  "app/api/v1/recipes/[recipeId]/versions/[version]/route.ts":
    apiV1RecipesRecipeidVersionsVersionRoute,
  "app/api/v1/recipes/route.ts": apiV1RecipesRoute,
  "app/api/v1/specifications/route.ts": apiV1SpecificationsRoute,
  "app/api/v1/test-runs/[runId]/extraction-series/route.ts":
    apiV1TestRunsRunidExtractionSeriesRoute,
  "app/api/v1/test-runs/[runId]/files/route.ts": apiV1TestRunsRunidFilesRoute,
  "app/api/v1/test-runs/[runId]/samples/route.ts": apiV1TestRunsRunidSamplesRoute,
  "app/api/v1/test-runs/[runId]/route.ts": apiV1TestRunsRunidRoute,
  "app/api/v1/test-runs/[runId]/lab-details/route.ts": apiV1TestRunsRunidLabDetailsRoute,
  "app/api/v1/test-runs/[runId]/report/route.ts": apiV1TestRunsRunidReportRoute,
  "app/api/v1/test-runs/route.ts": apiV1TestRunsRoute,
};

export const V1_ENDPOINTS: Record<string, EndpointRule> = rulesOf(V1_ROUTE_MODULES);
