import { z } from "zod";
import { WETTED_AREA_METHODS } from "@/db/enums";
import {
  optionalNumber,
  optionalText,
  requiredNumber,
  requiredText,
  textList,
  uuid,
} from "./fields";

/**
 * A part family as the engineer enters it. The wetted area carries every per-area limit, so it is
 * positive and says how it was found. Largest area: a 10 m² part is far beyond a parts washer [practice].
 */
export const partFamilySchema = z.object({
  code: requiredText("the family's code", 2, 40).pipe(
    z
      .string()
      .regex(
        /^[A-Za-z0-9][A-Za-z0-9._\/-]*$/,
        "Use letters, digits and . _ / - in the code, no spaces.",
      ),
  ),
  name: requiredText("the family's name", 2, 120),
  partNumbers: textList("part number", 200, 60),
  material: requiredText("the material", 2, 120),
  wettedAreaCm2: requiredNumber("Wetted area", "cm²", { above: 0, max: 100_000 }),
  wettedAreaMethod: z.enum(WETTED_AREA_METHODS, {
    error: "Say how the wetted area was determined.",
  }),
  wettedAreaNote: optionalText(500),
  wettedVolumeCm3: optionalNumber("Wetted volume", "cm³", { above: 0, max: 1_000_000 }),
  drawingNumber: optionalText(60),
  drawingRevision: optionalText(20),
  customer: optionalText(120),
  specId: uuid("the specification the family must meet"),
  description: optionalText(1000),
});
export type PartFamilyInput = z.output<typeof partFamilySchema>;

/** An edit names the family and, once the family is in use, why it changes. */
export const updatePartFamilySchema = partFamilySchema.extend({
  partFamilyId: uuid("the part family"),
  reason: optionalText(1000),
});
export type UpdatePartFamilyInput = z.output<typeof updatePartFamilySchema>;
