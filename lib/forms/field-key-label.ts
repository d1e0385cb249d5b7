/** "blankCounts" → "Blank counts", "rows.0.testType" → "Rows 1 test type": a name for an error no control on the form shows. */
export function fieldKeyLabel(key: string): string {
  const words = key
    .split(".")
    .map((part) =>
      /^\d+$/.test(part)
        ? String(Number(part) + 1)
        : part.replace(/([a-z0-9])([A-Z])/g, "$1 $2").toLowerCase(),
    )
    .join(" ");
  return words.charAt(0).toUpperCase() + words.slice(1);
}
