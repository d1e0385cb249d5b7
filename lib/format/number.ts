/** Numbers as the app shows them: British grouping and decimal point, and every number carries its unit. */

// Building a formatter costs far more than using one: a run with 100,000 samples formats
// hundreds of thousands of numbers for its outcome, so each precision's formatter is made once.
const formatters = new Map<number, Intl.NumberFormat>();

export function formatNumber(value: number, maxDigits = 3): string {
  let formatter = formatters.get(maxDigits);
  if (!formatter) {
    formatter = new Intl.NumberFormat("en-GB", { maximumFractionDigits: maxDigits });
    formatters.set(maxDigits, formatter);
  }
  return formatter.format(value);
}

/** "60 °C"; "—" when there is no value. */
export function withUnit(value: number | null, unit: string, maxDigits = 3): string {
  if (value === null) return "—";
  return `${formatNumber(value, maxDigits)} ${unit}`;
}

/** "55–65 °C", "≤ 65 °C", "≥ 55 °C" or "not set". */
export function rangeWithUnit(low: number | null, high: number | null, unit: string): string {
  if (low === null && high === null) return "not set";
  if (low === null) return `≤ ${formatNumber(high!)} ${unit}`;
  if (high === null) return `≥ ${formatNumber(low)} ${unit}`;
  return `${formatNumber(low)}–${formatNumber(high)} ${unit}`;
}

/** File sizes in binary units, as the evidence list shows them. */
export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KiB`;
  return `${(n / 1024 / 1024).toFixed(1)} MiB`;
}

/**
 * An upload size or limit for messages: kB below a megabyte, so a small limit never reads "0 MB".
 * Kept apart from formatBytes because upload refusals have always said "kB"/"MB" (1024-based).
 */
export function formatSize(bytes: number): string {
  return bytes < 1048576 ? `${(bytes / 1024).toFixed(1)} kB` : `${(bytes / 1048576).toFixed(1)} MB`;
}
