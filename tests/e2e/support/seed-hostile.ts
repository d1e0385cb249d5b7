/**
 * Stores hostile text in every field a user can fill, through the app's own
 * services, in the running e2e server's database; prints the ids it made as JSON.
 * Run by hostile-content.spec.ts: `tsx --conditions=react-server` so the
 * services' "server-only" guard lets a script import them.
 */
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  cleaningSystems,
  documentVersions,
  partFamilies,
  recipes,
  recipeVersions,
  systemStages,
  users,
  type Role,
} from "@/db/schema";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { loadRecipeSnapshot, writeRecipeContent } from "@/db/recipe-content";
import { appendAudit, canonicalJson, sha256Hex } from "@/lib/audit";
import { narrativeDocument } from "@/lib/changes/content";
import { proposalSchema } from "@/lib/schemas/change";
import { createDocumentSchema, contentJsonSchema } from "@/lib/schemas/document";
import { createRunSchema, SAMPLE_SCHEMAS, bathRecordSchema } from "@/lib/schemas/evidence";
import { systemSchema } from "@/lib/schemas/system";
import { createUserSchema } from "@/lib/schemas/account";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { recordBathEntry } from "@/lib/server/bath/record-bath-entry";
import { endChange } from "@/lib/server/changes/end-change";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { loadChangeState } from "@/lib/server/changes/state";
import { createDocument } from "@/lib/server/documents/create-document";
import { returnToAuthor } from "@/lib/server/documents/return-to-author";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { submitForReview } from "@/lib/server/documents/submit-for-review";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { storeEvidenceFile } from "@/lib/server/evidence/store-file";
import { updateSystem } from "@/lib/server/systems/update-system";
import { createUser } from "@/lib/server/users/create-user";
import { setUserActive } from "@/lib/server/users/set-user-active";
import { proposalForm } from "../../unit/support/proposal-form";
import { HOSTILE, HOSTILE_SHORT, FORMULA_REASON } from "./hostile";

const db = getDb();
async function person(role: string) {
  const [u] = await db
    .select()
    .from(users)
    .where(eq(users.email, `${role}@fennmoor.example`));
  return { id: u.id, name: u.name, roles: [role as Role] };
}
const admin = await person("admin");
const engineer = await person("engineer");
const technician = await person("technician");
const reviewer = await person("reviewer");
const approver = await person("approver");

// A person whose name is hostile and starts like a formula; the actor of the run below.
const { id: hostileUserId } = await createUser(
  admin,
  createUserSchema.parse({
    name: `@Hostile ${HOSTILE_SHORT}`,
    email: "hostile.tech@fennmoor.example",
    jobTitle: HOSTILE,
    roles: ["technician"],
  }),
);
const hostileUser = {
  id: hostileUserId,
  name: `@Hostile ${HOSTILE_SHORT}`,
  roles: ["technician" as Role],
};

// A document: hostile title; rich text with typed markup, a javascript: link, a link whose href breaks out of its quotes, and event-handler attributes.
const doc = await createDocument(
  engineer,
  createDocumentSchema.parse({
    type: "procedure",
    title: `Hostile procedure ${HOSTILE}`,
    confidencePct: "95",
    reliabilityPct: "90",
  }),
);
const rich = {
  type: "doc",
  content: [
    {
      type: "heading",
      attrs: { level: 2, onclick: "window.__xss=1" },
      content: [{ type: "text", text: `Heading ${HOSTILE}` }],
    },
    {
      type: "paragraph",
      attrs: { style: "background:url(javascript:window.__xss=1)", onmouseover: "window.__xss=1" },
      content: [
        { type: "text", text: `Body ${HOSTILE} ` },
        {
          type: "text",
          text: "script link",
          marks: [
            {
              type: "link",
              attrs: {
                href: "javascript:window.__xss=1",
                target: "_self",
                onclick: "window.__xss=1",
              },
            },
          ],
        },
        { type: "text", text: " " },
        {
          type: "text",
          text: "data link",
          marks: [
            { type: "link", attrs: { href: "data:text/html,<script>window.__xss=1</script>" } },
          ],
        },
        { type: "text", text: " " },
        {
          type: "text",
          text: "quote link",
          marks: [
            {
              type: "link",
              attrs: { href: 'https://fennmoor.example/" onmouseover="window.__xss=1' },
            },
          ],
        },
      ],
    },
  ],
};
await saveDraft(engineer, {
  versionId: doc.versionId,
  lockVersion: 0,
  content: contentJsonSchema.parse(JSON.stringify(rich)),
  overwrite: false,
});

// A second document, submitted and sent back by its reviewer with a hostile comment.
const rejected = await createDocument(
  engineer,
  createDocumentSchema.parse({
    type: "report",
    title: `Returned report ${HOSTILE}`,
    confidencePct: "95",
    reliabilityPct: "90",
  }),
);
await saveDraft(engineer, {
  versionId: rejected.versionId,
  lockVersion: 0,
  content: contentJsonSchema.parse(JSON.stringify(narrativeDocument("Short report."))),
  overwrite: false,
});
const [row] = await db
  .select()
  .from(documentVersions)
  .where(eq(documentVersions.id, rejected.versionId));
await submitForReview(engineer, {
  versionId: rejected.versionId,
  lockVersion: row.lockVersion,
  contentHash: sha256Hex(canonicalJson(row.content)),
  reviewerIds: [reviewer.id],
  approverId: approver.id,
  routing: "sequence",
  dueDate: null,
  password: DEMO_PASSWORD,
});
await returnToAuthor(reviewer, {
  versionId: rejected.versionId,
  comment: `Sent back ${HOSTILE}`,
  decision: "sent_back",
});

/**
 * A recipe of this test's own (a copy of R-SC1-SF's effective version), so its
 * change request never races another test that opens one on a demo recipe.
 */
async function ownRecipe() {
  const [source] = await db
    .select({ recipe: recipes, version: recipeVersions })
    .from(recipes)
    .innerJoin(recipeVersions, eq(recipeVersions.recipeId, recipes.id))
    .where(and(eq(recipes.code, "R-SC1-SF"), eq(recipeVersions.status, "effective")));
  const snapshot = await loadRecipeSnapshot(db, source.version.id);
  return db.transaction(async (tx) => {
    const [recipe] = await tx
      .insert(recipes)
      .values({
        systemId: source.recipe.systemId,
        code: "R-SC1-HX",
        name: "Hostile-text fitting",
        description: "For the hostile-content browser test.",
      })
      .returning();
    const [version] = await tx
      .insert(recipeVersions)
      .values({
        recipeId: recipe.id,
        version: 1,
        status: "effective",
        detergent: source.version.detergent,
        notes: source.version.notes,
        effectiveFrom: new Date().toISOString(),
        createdBy: admin.id,
      })
      .returning();
    await writeRecipeContent(tx, version.id, snapshot);
    await appendAudit(tx, admin, {
      eventType: "recipe.created",
      recordType: "recipe",
      recordId: recipe.id,
      new: { code: recipe.code, name: recipe.name },
    });
    return recipe;
  });
}

// Change requests: hostile title and narrative; one withdrawn with a hostile reason that starts like a formula.
const recipe = await ownRecipe();
const cr = await openChangeRequest(engineer, {
  recipeId: recipe.id,
  title: `Hostile change ${HOSTILE}`,
  kind: "parameter_change",
});
const state = await loadChangeState(db, cr.id);
// Proposal free text: the detergent and the recipe notes.
const proposal = proposalForm(state);
proposal.recipe.detergent = `Detergent ${HOSTILE_SHORT}`;
proposal.recipe.notes = `Notes ${HOSTILE}`;
await saveProposal(engineer, proposalSchema.parse(proposal));
await saveDraft(engineer, {
  versionId: state.narrative!.id,
  lockVersion: state.narrative!.lockVersion,
  content: contentJsonSchema.parse(JSON.stringify(narrativeDocument(`Narrative ${HOSTILE}`))),
  overwrite: false,
});
await endChange(engineer, { changeRequestId: cr.id, reason: FORMULA_REASON, how: "withdraw" });

// A cleaning system whose description and a stage's name an admin edited to hostile text.
const [system] = await db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-3"));
const stages = await db
  .select()
  .from(systemStages)
  .where(eq(systemStages.systemId, system.id))
  .orderBy(systemStages.position);
await updateSystem(
  admin,
  systemSchema.parse({
    systemId: system.id,
    name: system.name,
    description: `Description ${HOSTILE}`,
    stages: stages.map((s) => ({
      id: s.id,
      name: s.name === "Dryer" ? `Dryer ${HOSTILE_SHORT}` : s.name,
      kind: s.kind,
      capabilities: s.capabilities,
      tankVolumeL: s.tankVolumeL,
    })),
  }),
);
const dryer = stages.find((s) => s.name === "Dryer")!;

// An evidence run by the hostile person: hostile lab and requirement, a sample with hostile label and observation, a file with a hostile sample label.
const [family] = await db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
const [version] = await db
  .select({ id: recipeVersions.id })
  .from(recipeVersions)
  .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
  .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
const run = await createRun(
  hostileUser,
  createRunSchema.parse({
    partFamilyId: family.id,
    recipeVersionId: version.id,
    testType: "visual",
    technicianId: hostileUserId,
    lab: `Lab ${HOSTILE}`.slice(0, 120),
    performedOn: "2026-11-30",
    requirement: HOSTILE_SHORT,
  }),
);
await addSample(hostileUser, {
  runId: run.id,
  sample: SAMPLE_SCHEMAS.visual.parse({
    sampleLabel: HOSTILE_SHORT,
    basketPosition: "=1+1",
    acceptable: "yes",
    observation: `Seen ${HOSTILE}`,
  }) as never,
});
const { file } = await storeEvidenceFile(hostileUser, {
  runId: run.id,
  name: "report <b onmouseover=x>1.pdf",
  bytes: new TextEncoder().encode("%PDF-1.4\n%%EOF\n"),
  kind: "lab_report",
  sampleLabel: HOSTILE_SHORT,
});

// A bath-log entry with hostile notes and filter description, on Tank 2 (no maintenance intervals, so no queue item changes).
await recordBathEntry(
  technician,
  bathRecordSchema.parse({
    stageId: stages[1].id,
    kind: "filter_change",
    performedAt: "2026-11-29T08:00",
    filterDescription: HOSTILE_SHORT,
    filterRatingUm: "25",
    differentialPressureBar: "0.8",
    notes: `Notes ${HOSTILE}`,
  }),
);

// Deactivated (with a hostile reason) once the run is recorded, so no other test's notifications reach an extra technician.
await setUserActive(admin, { userId: hostileUserId, active: false, reason: `Left ${HOSTILE}` });

// A token for posting a result with a hostile label through the API.
const { token } = await createApiToken(technician, {
  name: `Token ${HOSTILE_SHORT}`,
  scope: "read_write",
});

console.log(
  JSON.stringify({
    documentId: doc.documentId,
    returnedId: rejected.documentId,
    changeId: cr.id,
    runId: run.id,
    systemId: system.id,
    stageId: stages[1].id,
    dryerId: dryer.id,
    hostileUserId,
    fileId: file.id,
    token,
  }),
);
