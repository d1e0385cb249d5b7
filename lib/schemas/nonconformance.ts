import { z } from "zod";
import "./messages";
import {
  CHANGE_KINDS,
  NC_ACTION_KINDS,
  NC_ACTION_STATUSES,
  NC_CAUSE_METHODS,
  NC_DISPOSITIONS,
  NC_EFFECTIVENESS_RESULTS,
  NC_MANUAL_KINDS,
  NC_SEVERITIES,
} from "@/db/enums";
import { todayUtc } from "@/lib/format/date";
import { calendarDate } from "./date";
import { contentJsonSchema } from "./document";
import { optionalText, optionalUuid, requiredText, uuid } from "./fields";
import { storedText } from "./text";

const dateOrNull = z.preprocess(
  (v) => (typeof v === "string" && v.trim() === "" ? null : v),
  calendarDate().nullable(),
);

export const ncIdSchema = z.object({ nonconformanceId: uuid("the nonconformance") });

/** A nonconformance reported by hand. */
export const openNcSchema = z.object({
  manualKind: z.enum(NC_MANUAL_KINDS, { error: "Choose what is being reported." }),
  reference: requiredText("the customer's or auditor's reference", 2, 120),
  title: requiredText("a short title", 5, 200),
  description: requiredText("what was found", 10, 5000),
  severity: z.enum(NC_SEVERITIES, { error: "Choose the severity." }),
  detectedOn: calendarDate("Enter the date it was detected.").refine(
    (d) => d <= todayUtc(),
    "The detection date cannot be in the future.",
  ),
  recipeId: optionalUuid("the recipe"),
  partFamilyId: optionalUuid("the part family"),
});

export const assignNcSchema = ncIdSchema.extend({
  ownerId: uuid("the owner"),
  dueOn: dateOrNull,
});

export const itemHoldSchema = ncIdSchema.extend({
  itemId: uuid("the item"),
  hold: z.enum(["held", "released"]),
});

/** Every item still undecided, held or released at once. */
export const pendingItemsHoldSchema = ncIdSchema.extend({
  hold: z.enum(["held", "released"]),
});

export const dispositionSchema = ncIdSchema
  .extend({
    itemId: uuid("the item"),
    disposition: z.enum(NC_DISPOSITIONS, { error: "Choose what happens to it." }),
    recleanRecipeId: optionalUuid("the recipe"),
    concessionReference: optionalText(120),
    concessionFileId: optionalUuid("the concession letter"),
    note: optionalText(1000),
  })
  .superRefine((v, ctx) => {
    if (v.disposition === "reclean" && !v.recleanRecipeId)
      ctx.addIssue({
        code: "custom",
        path: ["recleanRecipeId"],
        message: "Name the recipe the items are cleaned again under.",
      });
    if (v.disposition === "use_as_is" && !v.concessionReference)
      ctx.addIssue({
        code: "custom",
        path: ["concessionReference"],
        message: "Enter the customer's concession reference.",
      });
    if (v.disposition === "use_as_is" && !v.concessionFileId)
      ctx.addIssue({
        code: "custom",
        path: ["concessionFileId"],
        message: "Choose the customer's concession letter (upload it below first).",
      });
  });

export const rootCauseSchema = ncIdSchema.extend({
  method: z.enum(NC_CAUSE_METHODS, { error: "Choose the method used." }),
  // The editor sends nothing while it is empty.
  content: z
    .string({ error: "Describe the root cause." })
    .min(1, "Describe the root cause.")
    .pipe(contentJsonSchema),
});

export const addActionSchema = ncIdSchema.extend({
  kind: z.enum(NC_ACTION_KINDS, { error: "Choose corrective or preventive." }),
  description: requiredText("what will be done", 5, 500),
  ownerId: uuid("the owner"),
  dueOn: calendarDate("Enter the due date."),
});

export const updateActionSchema = ncIdSchema.extend({
  actionId: uuid("the action"),
  status: z.enum(NC_ACTION_STATUSES, { error: "Choose the status." }),
  evidenceLink: optionalText(300),
});

/** The change kinds a nonconformance's fix can be: recipe, detergent, interval, equipment. */
export const NC_CHANGE_KINDS = CHANGE_KINDS.filter(
  (k): k is "parameter_change" | "new_detergent" | "maintenance_interval" | "equipment" =>
    k !== "initial_validation" && k !== "new_part_family",
);
export const openChangeFromActionSchema = ncIdSchema.extend({
  actionId: uuid("the action"),
  kind: z.enum(NC_CHANGE_KINDS, { error: "Choose what the change touches." }),
});

export const planEffectivenessSchema = ncIdSchema.extend({
  criterion: requiredText("what will show the actions worked", 10, 1000),
  dueOn: calendarDate("Enter the date the check is due."),
});

export const recordEffectivenessSchema = ncIdSchema
  .extend({
    result: z.enum(NC_EFFECTIVENESS_RESULTS, { error: "Choose the result." }),
    evidenceRunNumber: optionalText(40),
    evidenceFileId: optionalUuid("the evidence file"),
    note: optionalText(1000),
  })
  .superRefine((v, ctx) => {
    if (!v.evidenceRunNumber && !v.evidenceFileId)
      ctx.addIssue({
        code: "custom",
        path: ["evidenceRunNumber"],
        message:
          "Give the evidence: the number of a verified test run, or a file uploaded to this nonconformance.",
      });
  });

export const advanceNcSchema = ncIdSchema.extend({
  to: z.enum(["contained", "cause_found", "actions_under_way", "effectiveness_check"]),
});

export const cancelNcSchema = ncIdSchema.extend({
  reason: storedText().trim().min(5, "Say why it is cancelled (at least 5 characters).").max(2000),
});

export const signClosureSchema = ncIdSchema.extend({
  meaning: z.enum(["authored", "approved"]),
  password: z.string().min(1, "Enter your password to sign."),
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
});
