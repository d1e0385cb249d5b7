/** Plain words for stored codes, so screens never show an identifier where a person expects a word. */
export function humanize(code: string): string {
  const s = code.replace(/_/g, " ");
  return s.charAt(0).toUpperCase() + s.slice(1);
}

export const STAGE_MODE_LABELS: Record<string, string> = {
  ultrasonic: "Ultrasonic",
  spray: "Spray",
  injection: "Injection (bores)",
  flood: "Flood",
  immersion: "Immersion",
  hot_air_drying: "Hot-air drying",
  vacuum_drying: "Vacuum drying",
};

export function formatNumber(value: number, maxDigits = 3): string {
  return new Intl.NumberFormat("en-GB", { maximumFractionDigits: maxDigits }).format(value);
}

/** "60 °C" or "55–65 °C": every number carries its unit. */
export function withUnit(value: number | null, unit: string): string {
  if (value === null) return "—";
  return `${formatNumber(value)} ${unit}`;
}

export function rangeWithUnit(low: number | null, high: number | null, unit: string): string {
  if (low === null && high === null) return "not set";
  if (low === null) return `≤ ${formatNumber(high!)} ${unit}`;
  if (high === null) return `≥ ${formatNumber(low)} ${unit}`;
  return `${formatNumber(low)}–${formatNumber(high)} ${unit}`;
}
