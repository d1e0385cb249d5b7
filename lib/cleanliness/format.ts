/**
 * Numbers in reasons and N() codes: whole numbers as they are, others to one decimal from 100 up
 * and two below, trailing zeros dropped ("124.9", "8.92", "4.67", "0.5").
 */
export function formatCount(value: number): string {
  if (Number.isInteger(value)) return String(value);
  const magnitude = Math.abs(value);
  if (magnitude >= 1e15) return value.toFixed(0);
  // Built from the whole part and a ready-made fraction (".9", ".05"): converting one integer
  // to text is several times faster than toFixed, and this runs for every row of every result.
  let text: string;
  if (magnitude >= 100) {
    const tenths = Math.round(magnitude * 10);
    const whole = Math.floor(tenths / 10);
    text = whole + TENTHS[tenths - whole * 10];
  } else {
    const hundredths = Math.round(magnitude * 100);
    const whole = Math.floor(hundredths / 100);
    text = whole + HUNDREDTHS[hundredths - whole * 100];
  }
  return value < 0 && text !== "0" ? "-" + text : text;
}

// Fraction suffixes with trailing zeros dropped: TENTHS[3] = ".3", HUNDREDTHS[50] = ".5".
const TENTHS = Array.from({ length: 10 }, (_, f) => (f === 0 ? "" : `.${f}`));
const HUNDREDTHS = Array.from({ length: 100 }, (_, f) =>
  f === 0 ? "" : f % 10 === 0 ? `.${f / 10}` : `.${String(f).padStart(2, "0")}`,
);

/** A fraction as a percentage with one decimal: 0.058 → "5.8 %". */
export function formatPercent(fraction: number): string {
  return `${(fraction * 100).toFixed(1)} %`;
}
