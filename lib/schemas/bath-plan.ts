import { z } from "zod";
import "./messages";
import { BATH_CHEMISTRY_KEYS } from "@/db/enums";
import { limitOrderProblems } from "@/lib/bath/limits";
import { optionalNumber, optionalText, requiredNumber } from "./evidence";
import { uuid } from "./fields";
import { storedText } from "./text";

export const detergentSchema = z.object({
  name: storedText().trim().min(1).max(100),
  supplier: optionalText(100),
  titrationMethod: optionalText(300),
  factorPctPerMl: requiredNumber("Titration factor (% per mL)", { min: 0, max: 100 }).refine(
    (n) => n > 0,
    "The titration factor must be greater than zero.",
  ),
});
export type DetergentInput = z.output<typeof detergentSchema>;

/** One line of a tank's measurement plan; limits in the wrong order are refused beside their field. */
export const bathLimitSchema = z
  .object({
    stageId: uuid("the tank"),
    variable: z.enum(BATH_CHEMISTRY_KEYS),
    recipeVersionId: uuid("the recipe version"),
    detergentId: z.preprocess(
      (v) => (v === "" || v === null ? undefined : v),
      z.uuid("Choose the detergent from the list.").optional(),
    ),
    target: optionalNumber("Target", { min: -1000, max: 200_000 }),
    actionLow: optionalNumber("Action low", { min: -1000, max: 200_000 }),
    actionHigh: optionalNumber("Action high", { min: -1000, max: 200_000 }),
    rejectLow: optionalNumber("Reject low", { min: -1000, max: 200_000 }),
    rejectHigh: optionalNumber("Reject high", { min: -1000, max: 200_000 }),
  })
  .superRefine((l, ctx) => {
    const limits = {
      target: l.target ?? null,
      actionLow: l.actionLow ?? null,
      actionHigh: l.actionHigh ?? null,
      rejectLow: l.rejectLow ?? null,
      rejectHigh: l.rejectHigh ?? null,
    };
    for (const p of limitOrderProblems(limits))
      ctx.addIssue({ code: "custom", path: [p.field], message: p.message });
    if (l.variable === "ph")
      for (const [k, v] of Object.entries(limits))
        if (v !== null && (v < 0 || v > 14))
          ctx.addIssue({ code: "custom", path: [k], message: "pH lies between 0 and 14." });
  });
export type BathLimitInput = z.output<typeof bathLimitSchema>;
