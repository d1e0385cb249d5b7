import { z } from "zod";
import "./messages";
import { storedText } from "@/lib/schemas/text";
import { STAGE_KINDS, STAGE_MODES } from "@/db/enums";
import { optionalNumber, optionalText, requiredText } from "./fields";

const optionalLitres = z.preprocess(
  (v) =>
    typeof v === "string" ? (v.trim() === "" ? null : Number(v.replace(",", "."))) : (v ?? null),
  z
    .number({ error: "Enter the volume in litres or leave empty." })
    .finite("Enter the volume in litres or leave empty.")
    .positive("A tank volume is greater than 0 L.")
    .max(100_000, "Check the volume: over 100 000 L.")
    .nullable(),
);

export const systemStageSchema = z.object({
  id: z.string().uuid().nullable(),
  name: storedText().trim().min(2, "Name the stage.").max(120),
  kind: z.enum(STAGE_KINDS, { error: "Choose the kind of stage." }),
  capabilities: z.array(z.enum(STAGE_MODES)).min(1, "Tick at least one mode the stage can run."),
  tankVolumeL: optionalLitres,
  // Left out (not undefined-as-empty) means "keep what is stored", so an editor that does not show these fields
  // cannot erase them. Bounds catch typing errors, not process limits [practice]: bag and cartridge filters run about 1–200 µm,
  // industrial ultrasonic generators up to tens of kW at 20–200 kHz, washer pumps up to a few hundred bar.
  filterRatingUm: optionalNumber("Filter rating", "µm", { above: 0, max: 1000 }).optional(),
  ultrasonicPowerW: optionalNumber("Ultrasonic power", "W", { above: 0, max: 100_000 }).optional(),
  ultrasonicFrequencyKHz: optionalNumber("Ultrasonic frequency", "kHz", {
    min: 15,
    max: 400,
  }).optional(),
  sprayPressureBar: optionalNumber("Spray pressure", "bar", { above: 0, max: 500 }).optional(),
  injectionPressureBar: optionalNumber("Injection pressure", "bar", {
    above: 0,
    max: 1000,
  }).optional(),
  nozzleSet: optionalText(120).optional(),
});

/** A cleaning system and its stages; stages are kept (never deleted) because tank records refer to them. */
export const systemSchema = z.object({
  systemId: z.string().uuid(),
  name: storedText().trim().min(2, "Name the system.").max(120),
  description: storedText()
    .trim()
    .max(1000)
    .transform((v) => v || null),
  stages: z.array(systemStageSchema).min(1, "A system has at least one stage.").max(12),
});
export type SystemInput = z.output<typeof systemSchema>;

export const SYSTEM_KINDS = ["multi_tank_aqueous", "single_chamber_spray", "other"] as const;

/** A new cleaning system: its codes, kind and stages in process order. */
export const createSystemSchema = z.object({
  code: requiredText("the system's short code", 2, 20).pipe(
    z
      .string()
      .regex(
        /^[A-Za-z0-9][A-Za-z0-9._\/-]*$/,
        "Use letters, digits and . _ / - in the code, no spaces.",
      ),
  ),
  assetNumber: optionalText(40),
  name: storedText().trim().min(2, "Name the system.").max(120),
  kind: z.enum(SYSTEM_KINDS, { error: "Choose the kind of system." }),
  description: storedText()
    .trim()
    .max(1000)
    .transform((v) => v || null),
  stages: z.array(systemStageSchema).min(1, "A system has at least one stage.").max(12),
});
export type CreateSystemInput = z.output<typeof createSystemSchema>;

/** The new-system form: the system and the site it stands at. */
export const newSystemFormSchema = createSystemSchema.extend({
  siteId: z.string({ error: "Choose the site." }).uuid("Choose the site."),
});

export const retireSystemSchema = z.object({
  systemId: z.string().uuid(),
  reason: requiredText("why the system is retired", 5, 1000),
});
export type RetireSystemInput = z.output<typeof retireSystemSchema>;
