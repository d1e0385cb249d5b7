import { z } from "zod";
import "./messages";
import { storedText } from "@/lib/schemas/text";
import { STAGE_KINDS, STAGE_MODES } from "@/db/enums";

const optionalLitres = z.preprocess(
  (v) => (typeof v === "string" ? (v.trim() === "" ? null : Number(v.replace(",", "."))) : (v ?? null)),
  z.number({ error: "Enter the volume in litres or leave empty." }).finite("Enter the volume in litres or leave empty.").positive("A tank volume is greater than 0 L.").max(100_000, "Check the volume: over 100 000 L.").nullable(),
);

export const systemStageSchema = z.object({
  id: z.string().uuid().nullable(),
  name: storedText().trim().min(2, "Name the stage.").max(120),
  kind: z.enum(STAGE_KINDS, { error: "Choose the kind of stage." }),
  capabilities: z.array(z.enum(STAGE_MODES)).min(1, "Tick at least one mode the stage can run."),
  tankVolumeL: optionalLitres,
});

/** A cleaning system and its stages; stages are kept (never deleted) because tank records refer to them. */
export const systemSchema = z.object({
  systemId: z.string().uuid(),
  name: storedText().trim().min(2, "Name the system.").max(120),
  description: storedText().trim().max(1000).transform((v) => v || null),
  stages: z.array(systemStageSchema).min(1, "A system has at least one stage.").max(12),
});
export type SystemInput = z.output<typeof systemSchema>;
