import type { Action } from "./permissions";

/**
 * Who may call an endpoint:
 * - public: anyone, signed in or not (signing in and out, the API description);
 * - session: a signed-in user whose role may take `action` (server actions and /api routes);
 *   `when` names an input field that switches to another action (signing a run as performed);
 * - token: a bearer API token whose owner's role may take `action`, and whose scope is at
 *   least `scope` (/api/v1).
 */
export type EndpointRule =
  | { auth: "public" }
  | { auth: "session"; action: Action; when?: { field: string; value: string; action: Action } }
  | { auth: "token"; action: Action; scope: "read" | "read_write" };

const PUBLIC: EndpointRule = { auth: "public" };
const session = (action: Action): EndpointRule => ({ auth: "session", action });
const token = (action: Action, scope: "read" | "read_write" = "read"): EndpointRule => ({ auth: "token", action, scope });

/**
 * Every public endpoint and the permission it requires: each export of an `actions.ts`
 * ("<file>#<export>") and each method of a `route.ts` ("<METHOD> <file>"). The role for
 * each permission is in PERMISSIONS; tests/unit/authorization-matrix.test.ts finds every
 * endpoint on disk, fails on one missing here (or an entry with no endpoint), and calls
 * each as every role to prove the endpoint's own check agrees with this table.
 */
export const ENDPOINTS: Record<string, EndpointRule> = {
  "app/(auth)/sign-in/actions.ts#signInAction": PUBLIC,
  "app/(app)/actions.ts#signOutAction": PUBLIC,
  "app/(app)/account/password/actions.ts#changePasswordAction": session("account.change_password"),
  "app/(app)/account/tokens/actions.ts#createApiTokenAction": session("account.manage_tokens"),
  "app/(app)/account/tokens/actions.ts#revokeApiTokenAction": session("account.manage_tokens"),

  "app/(app)/admin/actions.ts#createUserAction": session("users.manage"),
  "app/(app)/admin/actions.ts#updateUserAction": session("users.manage"),
  "app/(app)/admin/actions.ts#setUserActiveAction": session("users.manage"),
  "app/(app)/admin/actions.ts#resetPasswordAction": session("users.manage"),
  "app/(app)/admin/actions.ts#sendTestEmailAction": session("users.manage"),
  "app/(app)/admin/matrix/actions.ts#saveMatrixAction": session("matrix.manage"),
  "app/(app)/systems/actions.ts#updateSystemAction": session("systems.manage"),

  "app/(app)/changes/actions.ts#openChangeAction": session("change.draft"),
  "app/(app)/changes/actions.ts#saveProposalAction": session("recipe.edit"),
  "app/(app)/changes/actions.ts#assessChangeAction": session("change.draft"),
  "app/(app)/changes/actions.ts#approveChangeAction": session("change.approve"),
  "app/(app)/changes/actions.ts#verifyChangeAction": session("change.verify"),
  "app/(app)/changes/actions.ts#startRequalificationAction": session("change.draft"),
  "app/(app)/changes/actions.ts#closeChangeAction": session("recipe.make_effective"),
  "app/(app)/changes/actions.ts#linkEvidenceAction": session("evidence.record"),
  "app/(app)/changes/actions.ts#rejectChangeAction": session("change.approve"),
  "app/(app)/changes/actions.ts#withdrawChangeAction": session("change.draft"),
  "app/(app)/changes/actions.ts#reopenChangeAction": session("change.draft"),
  "app/(app)/changes/actions.ts#setIntervalAction": session("recipe.edit"),

  "app/(app)/documents/actions.ts#createDocumentAction": session("document.draft"),
  "app/(app)/documents/actions.ts#saveDraftAction": session("document.draft"),
  "app/(app)/documents/actions.ts#submitAction": session("document.submit"),
  "app/(app)/documents/actions.ts#signReviewAction": session("document.review"),
  "app/(app)/documents/actions.ts#approveAction": session("document.approve"),
  "app/(app)/documents/actions.ts#sendBackAction": session("document.review"),
  "app/(app)/documents/actions.ts#rejectAction": session("document.approve"),
  "app/(app)/documents/actions.ts#newVersionAction": session("document.draft"),
  "app/(app)/documents/actions.ts#retireAction": session("document.approve"),

  "app/(app)/evidence/actions.ts#createRunAction": session("evidence.record"),
  "app/(app)/evidence/actions.ts#addSampleAction": session("evidence.record"),
  "app/(app)/evidence/actions.ts#removeSampleAction": session("evidence.record"),
  "app/(app)/evidence/actions.ts#saveRunDataAction": session("evidence.record"),
  "app/(app)/evidence/actions.ts#signRunAction": {
    auth: "session",
    action: "evidence.verify",
    when: { field: "meaning", value: "performed", action: "evidence.sign_performed" },
  },
  "app/(app)/evidence/actions.ts#reviseRunAction": session("evidence.record"),
  "app/(app)/evidence/actions.ts#recordBathAction": session("bath.record"),
  "app/(app)/evidence/actions.ts#setIntervalAction": session("bath.manage_intervals"),

  "app/(app)/trace/audit/actions.ts#verifyIntegrityAction": session("audit.view"),
  "app/(app)/trace/audit/actions.ts#writeCheckpointAction": session("audit.view"),

  "GET app/api/queue/route.ts": session("queue.view"),
  "GET app/api/audit-events/route.ts": session("audit.view"),
  "GET app/api/audit-events/export/route.ts": session("audit.export"),
  "GET app/api/audit-pack/[changeId]/route.ts": session("trace.export"),
  "GET app/api/trace/parameters/route.ts": session("trace.view"),
  "GET app/api/documents/[documentId]/versions/[version]/pdf/route.ts": session("document.export"),
  "GET app/api/evidence/runs/route.ts": session("evidence.view"),
  "GET app/api/evidence/files/[fileId]/route.ts": session("evidence.view"),
  "POST app/api/evidence/runs/[runId]/files/route.ts": session("evidence.record"),
  "POST app/api/evidence/runs/[runId]/import/route.ts": session("evidence.record"),

  "GET app/api/v1/openapi.json/route.ts": PUBLIC,
  "GET app/api/v1/audit-events/route.ts": token("audit.view"),
  "GET app/api/v1/change-requests/route.ts": token("changes.view"),
  "GET app/api/v1/change-requests/[changeRequestId]/route.ts": token("changes.view"),
  "GET app/api/v1/cleaning-systems/route.ts": token("systems.view"),
  "GET app/api/v1/recipes/route.ts": token("systems.view"),
  "GET app/api/v1/recipes/[recipeId]/route.ts": token("systems.view"),
  "GET app/api/v1/recipes/[recipeId]/versions/[version]/route.ts": token("systems.view"),
  "GET app/api/v1/test-runs/route.ts": token("evidence.view"),
  "GET app/api/v1/test-runs/[runId]/route.ts": token("evidence.view"),
  "POST app/api/v1/test-runs/[runId]/results/route.ts": token("evidence.record", "read_write"),
};
