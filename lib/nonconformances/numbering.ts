/** NC-YYYY-NNN: the next number in the year, never reusing or skipping one. */
export function nextNcNumber(
  year: number,
  lastSequence: number | null,
): { sequence: number; number: string } {
  const sequence = (lastSequence ?? 0) + 1;
  return { sequence, number: `NC-${year}-${String(sequence).padStart(3, "0")}` };
}
