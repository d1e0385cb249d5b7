import { z } from "zod";
import "./messages";
import { calendarDate } from "./date";

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .optional()
    .transform((v) => v || undefined);

/** Filters of the audit-trail browser and its CSV export (query string). */
export const auditQuerySchema = z
  .object({
    actor: optionalText(64),
    recordType: optionalText(40),
    recordId: optionalText(100),
    /** An event type; today's name also finds events stored under an earlier one. */
    eventType: optionalText(60),
    from: z
      .literal("")
      .transform(() => undefined)
      .or(calendarDate().optional()),
    to: z
      .literal("")
      .transform(() => undefined)
      .or(calendarDate().optional()),
    /** Keyset cursor: events with a sequence number below this one. */
    before: z.coerce.number().int().positive().optional(),
    limit: z.coerce.number().int().min(1).max(200).default(50),
  })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, {
    path: ["to"],
    message: "The end date is before the start date.",
  });

export type AuditQuery = z.infer<typeof auditQuerySchema>;
