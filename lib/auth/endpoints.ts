import "server-only";
import { V1_ROUTE_MODULES } from "@/lib/api/v1-routes";
import * as appAccountPasswordActions from "@/app/(app)/account/password/actions";
import * as appAccountTokensActions from "@/app/(app)/account/tokens/actions";
import * as appActions from "@/app/(app)/actions";
import * as appAdminActions from "@/app/(app)/admin/actions";
import * as appAdminMatrixActions from "@/app/(app)/admin/matrix/actions";
import * as appAdminChangeControlActions from "@/app/(app)/admin/change-control/actions";
import * as appChangesActions from "@/app/(app)/changes/actions";
import * as appDeviationsActions from "@/app/(app)/deviations/actions";
import * as appControlPlansActions from "@/app/(app)/control-plans/actions";
import * as appAdminShiftsActions from "@/app/(app)/admin/shifts/actions";
import * as appInstrumentsActions from "@/app/(app)/instruments/actions";
import * as appLabMethodsActions from "@/app/(app)/lab/methods/actions";
import * as appLabTrainingActions from "@/app/(app)/lab/training/actions";
import * as appDocumentsActions from "@/app/(app)/documents/actions";
import * as appCyclesActions from "@/app/(app)/cycles/actions";
import * as appEvidenceActions from "@/app/(app)/evidence/actions";
import * as appEvidenceBathActions from "@/app/(app)/evidence/bath/actions";
import * as appEvidenceRunsRunidActions from "@/app/(app)/evidence/runs/[runId]/actions";
import * as appNonconformancesActions from "@/app/(app)/nonconformances/actions";
import * as appPartsActions from "@/app/(app)/parts/actions";
import * as appSystemsActions from "@/app/(app)/systems/actions";
import * as appSystemsSystemidRecipesNewActions from "@/app/(app)/systems/[systemId]/recipes/new/actions";
import * as appTraceAuditActions from "@/app/(app)/trace/audit/actions";
import * as authSetUpActions from "@/app/(auth)/set-up/actions";
import * as authSignInActions from "@/app/(auth)/sign-in/actions";
import * as apiAuditEventsExportRoute from "@/app/api/audit-events/export/route";
import * as apiAuditEventsRoute from "@/app/api/audit-events/route";
import * as apiBathPhotosRoute from "@/app/api/bath/photos/route";
import * as apiInstrumentsCertificatesRoute from "@/app/api/instruments/certificates/route";
import * as apiAuditPackChangeidRoute from "@/app/api/audit-pack/[changeId]/route";
import * as apiDocumentsDocumentidVersionsVersionPdfRoute from "@/app/api/documents/[documentId]/versions/[version]/pdf/route";
import * as apiEvidenceFilesFileidRoute from "@/app/api/evidence/files/[fileId]/route";
import * as apiEvidenceProtocolsRoute from "@/app/api/evidence/protocols/route";
import * as apiEvidenceFamilyVersionsRoute from "@/app/api/evidence/family-versions/route";
import * as apiEvidenceRunsRunidFilesRoute from "@/app/api/evidence/runs/[runId]/files/route";
import * as apiCyclesImportRoute from "@/app/api/cycles/import/route";
import * as apiEvidenceRunsRunidImportRoute from "@/app/api/evidence/runs/[runId]/import/route";
import * as apiLotsLotExportRoute from "@/app/api/lots/[lot]/export/route";
import * as apiEvidenceRunsRunidReportRoute from "@/app/api/evidence/runs/[runId]/report/route";
import * as apiEvidenceRunsRoute from "@/app/api/evidence/runs/route";
import * as apiNonconformancesNcidFilesRoute from "@/app/api/nonconformances/[ncId]/files/route";
import * as apiPartsExportRoute from "@/app/api/parts/export/route";
import * as apiPartsFamiliesFamilyidPictureRoute from "@/app/api/parts/families/[familyId]/picture/route";
import * as apiPartsImportRoute from "@/app/api/parts/import/route";
import * as apiPartsSpecsSourceRoute from "@/app/api/parts/specs/source/route";
import * as apiChangesCustomerLetterRoute from "@/app/api/changes/customer-letter/route";
import * as apiQueueRoute from "@/app/api/queue/route";
import * as apiRecipesRecipeidCsvRoute from "@/app/api/recipes/[recipeId]/csv/route";
import * as apiSystemsSystemidRecipesImportRoute from "@/app/api/systems/[systemId]/recipes/import/route";
import * as apiTraceParametersRoute from "@/app/api/trace/parameters/route";
import * as apiTraceRecipesRoute from "@/app/api/trace/recipes/route";
import * as apiV1OpenapiJsonRoute from "@/app/api/v1/openapi.json/route";
import { rulesOf, type EndpointRule } from "./endpoint-rule";

export type { EndpointRule };

/**
 * Every module that holds public endpoints: each `actions.ts` and each `route.ts` under app/. An
 * endpoint declares its own permission (defineAction, defineRoute, apiRoute); this list only says
 * where to look. tests/unit/authorization-matrix.test.ts fails when a file on disk is missing here.
 */
export const ENDPOINT_MODULES: Record<string, Record<string, unknown>> = {
  "app/(app)/account/password/actions.ts": appAccountPasswordActions,
  "app/(app)/account/tokens/actions.ts": appAccountTokensActions,
  "app/(app)/actions.ts": appActions,
  "app/(app)/admin/actions.ts": appAdminActions,
  "app/(app)/admin/matrix/actions.ts": appAdminMatrixActions,
  "app/(app)/admin/change-control/actions.ts": appAdminChangeControlActions,
  "app/(app)/changes/actions.ts": appChangesActions,
  "app/(app)/deviations/actions.ts": appDeviationsActions,
  "app/(app)/control-plans/actions.ts": appControlPlansActions,
  "app/(app)/admin/shifts/actions.ts": appAdminShiftsActions,
  "app/(app)/instruments/actions.ts": appInstrumentsActions,
  "app/(app)/lab/methods/actions.ts": appLabMethodsActions,
  "app/(app)/lab/training/actions.ts": appLabTrainingActions,
  "app/(app)/documents/actions.ts": appDocumentsActions,
  "app/(app)/cycles/actions.ts": appCyclesActions,
  "app/(app)/evidence/actions.ts": appEvidenceActions,
  "app/(app)/evidence/bath/actions.ts": appEvidenceBathActions,
  "app/(app)/evidence/runs/[runId]/actions.ts": appEvidenceRunsRunidActions,
  "app/(app)/nonconformances/actions.ts": appNonconformancesActions,
  "app/(app)/parts/actions.ts": appPartsActions,
  "app/(app)/systems/actions.ts": appSystemsActions,
  "app/(app)/systems/[systemId]/recipes/new/actions.ts": appSystemsSystemidRecipesNewActions,
  "app/(app)/trace/audit/actions.ts": appTraceAuditActions,
  "app/(auth)/set-up/actions.ts": authSetUpActions,
  "app/(auth)/sign-in/actions.ts": authSignInActions,
  "app/api/audit-events/export/route.ts": apiAuditEventsExportRoute,
  "app/api/audit-events/route.ts": apiAuditEventsRoute,
  "app/api/audit-pack/[changeId]/route.ts": apiAuditPackChangeidRoute,
  "app/api/bath/photos/route.ts": apiBathPhotosRoute,
  "app/api/instruments/certificates/route.ts": apiInstrumentsCertificatesRoute,
  "app/api/documents/[documentId]/versions/[version]/pdf/route.ts":
    apiDocumentsDocumentidVersionsVersionPdfRoute,
  "app/api/evidence/files/[fileId]/route.ts": apiEvidenceFilesFileidRoute,
  "app/api/evidence/protocols/route.ts": apiEvidenceProtocolsRoute,
  "app/api/evidence/family-versions/route.ts": apiEvidenceFamilyVersionsRoute,
  "app/api/evidence/runs/[runId]/files/route.ts": apiEvidenceRunsRunidFilesRoute,
  "app/api/cycles/import/route.ts": apiCyclesImportRoute,
  "app/api/evidence/runs/[runId]/import/route.ts": apiEvidenceRunsRunidImportRoute,
  "app/api/lots/[lot]/export/route.ts": apiLotsLotExportRoute,
  "app/api/evidence/runs/[runId]/report/route.ts": apiEvidenceRunsRunidReportRoute,
  "app/api/evidence/runs/route.ts": apiEvidenceRunsRoute,
  "app/api/nonconformances/[ncId]/files/route.ts": apiNonconformancesNcidFilesRoute,
  "app/api/parts/export/route.ts": apiPartsExportRoute,
  "app/api/parts/families/[familyId]/picture/route.ts": apiPartsFamiliesFamilyidPictureRoute,
  "app/api/parts/import/route.ts": apiPartsImportRoute,
  "app/api/parts/specs/source/route.ts": apiPartsSpecsSourceRoute,
  "app/api/changes/customer-letter/route.ts": apiChangesCustomerLetterRoute,
  "app/api/queue/route.ts": apiQueueRoute,
  "app/api/recipes/[recipeId]/csv/route.ts": apiRecipesRecipeidCsvRoute,
  "app/api/systems/[systemId]/recipes/import/route.ts": apiSystemsSystemidRecipesImportRoute,
  "app/api/trace/parameters/route.ts": apiTraceParametersRoute,
  "app/api/trace/recipes/route.ts": apiTraceRecipesRoute,
  "app/api/v1/openapi.json/route.ts": apiV1OpenapiJsonRoute,
  ...V1_ROUTE_MODULES,
};

/**
 * Every public endpoint and the rule it declared: each export of an `actions.ts` ("<file>#<export>")
 * and each method of a `route.ts` ("<METHOD> <file>"). The roles for each permission are in
 * PERMISSIONS; the authorisation matrix calls every endpoint as every role against this table.
 */
export const ENDPOINTS: Record<string, EndpointRule> = rulesOf(ENDPOINT_MODULES);
