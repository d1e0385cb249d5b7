import { z } from "zod";
import "./messages";
import { calendarDate } from "@/lib/schemas/date";
import { storedText } from "@/lib/schemas/text";
import { signedStepSchema, changeIdSchema } from "@/lib/schemas/change";

/** Implementing a change before approval: the engineer signs, says why, and sets when approval must follow. */
export const emergencySchema = signedStepSchema.extend({
  justification: storedText()
    .trim()
    .min(20, "Say why this cannot wait for approval (at least 20 characters).")
    .max(4000),
  approvalDueOn: calendarDate("Enter the date by which an approver must sign."),
});

export const affectedDocumentSchema = changeIdSchema.extend({
  documentId: z.uuid({ error: "Choose a document from the register." }),
});

export const unaffectedSchema = affectedDocumentSchema.extend({
  reason: storedText()
    .trim()
    .min(10, "Say why this document is not affected (at least 10 characters).")
    .max(2000),
});

const whole = (min: number, max: number, what: string) =>
  z.preprocess(
    (v) => (typeof v === "string" ? (v.trim() === "" ? undefined : Number(v)) : v),
    z
      .number({ error: `Enter the number of ${what}.` })
      .int("Enter a whole number.")
      .min(min, `At least ${min}.`)
      .max(max, `At most ${max}.`),
  );

export const changeControlSettingsSchema = z.object({
  emergencyApprovalDays: whole(1, 30, "days"),
  effectivenessRuns: whole(1, 20, "runs"),
});

/** The customer's decision on a change, for one specification that asks for it. */
export const customerDecisionSchema = changeIdSchema.extend({
  specId: z.uuid(),
  decision: z.enum(["approved", "rejected"], { error: "Choose the customer's decision." }),
  decidedOn: calendarDate("Enter the date of the customer's decision."),
  reference: storedText()
    .trim()
    .min(2, "Give the customer's reference (letter or approval number).")
    .max(120),
  letterFileId: z.uuid({ error: "Upload the customer's letter." }),
});
