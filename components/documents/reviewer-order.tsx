"use client";

import { CheckboxField, FieldError } from "@/components/ui/field";
import { MoveRowButtons, useRowList } from "@/components/ui/row-list";

export interface ReviewerOrderProps {
  reviewers: { id: string; label: string }[];
  /** The reviewers of the last round, in the order they signed: ticked and listed first. */
  chosen: string[];
}

/**
 * Reviewers to tick, in an order the author can change: the ticked boxes are submitted in
 * the order shown, which is the order reviewers sign in when they sign in sequence.
 */
export function ReviewerOrder({ reviewers, chosen }: ReviewerOrderProps) {
  const list = useRowList(() => [
    ...chosen
      .map((id) => reviewers.find((r) => r.id === id))
      .filter((r) => r !== undefined)
      .map((r) => ({ ...r, ticked: true })),
    ...reviewers.filter((r) => !chosen.includes(r.id)).map((r) => ({ ...r, ticked: false })),
  ]);
  return (
    <fieldset className="space-y-1">
      <legend className="text-sm font-medium text-stone-800">Reviewers</legend>
      <p className="text-xs text-stone-600">
        In sequence, the ticked reviewers sign from the top down; move them to change the order.
      </p>
      <ol className="space-y-1" aria-label="Reviewers in signing order">
        {list.rows.map((row, i) => (
          <li key={row.key} className="flex items-center justify-between gap-2">
            <CheckboxField
              name="reviewerIds"
              value={row.value.id}
              label={row.value.label}
              // The group's error is shown once below, not under every box.
              errorKey={`reviewerIds.row-${row.value.id}`}
              checked={row.value.ticked}
              onCheckedChange={(ticked) => list.update(i, { ticked })}
            />
            <MoveRowButtons
              label={row.value.label}
              first={i === 0}
              last={i === list.rows.length - 1}
              onMove={(by) => list.move(i, by)}
            />
          </li>
        ))}
      </ol>
      <FieldError name="reviewerIds" />
    </fieldset>
  );
}
