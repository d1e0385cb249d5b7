import type { ChangeState } from "@/lib/server/changes/state";

/**
 * The proposal form's payload for a change request as it was loaded, numbers as
 * the text a user would type; `edit` changes parameters the way the form would.
 */
export function proposalForm(
  s: ChangeState,
  edit: (p: Record<string, unknown>) => void = () => {},
  extra: Record<string, unknown> = {},
) {
  const text = (v: number | null) => (v === null ? "" : String(v));
  const recipe = {
    detergent: s.to.detergent ?? "",
    notes: s.to.notes ?? "",
    stages: s.to.stages.map((st) => ({
      ...st,
      parameters: st.parameters.map((p) => ({
        ...p,
        setpoint: String(p.setpoint),
        validatedLow: text(p.validatedLow),
        validatedHigh: text(p.validatedHigh),
      })),
    })),
  };
  for (const st of recipe.stages)
    for (const p of st.parameters) edit(p as unknown as Record<string, unknown>);
  return {
    changeRequestId: s.cr.id,
    lockVersion: s.assessmentRow.lockVersion,
    title: s.cr.title,
    kind: "parameter_change",
    partFamilyId: "",
    raiseTo: "",
    raiseReason: "",
    recipe,
    ...extra,
  };
}
