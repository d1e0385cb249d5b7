/** Plain words for stored codes, so screens never show an identifier where a person expects a word. */
export function humanize(code: string): string {
  const s = code
    .split("_")
    .map((word) => ACRONYMS.get(word.toLowerCase()) ?? word)
    .join(" ");
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** Abbreviations a code holds in lower case that read wrong capitalised ("Uv inspection"). */
const ACRONYMS = new Map(
  ["uv", "iq", "oq", "pq", "csv", "pdf", "api", "id"].map((a) => [a, a.toUpperCase()]),
);

export const STAGE_MODE_LABELS: Record<string, string> = {
  ultrasonic: "Ultrasonic",
  spray: "Spray",
  injection: "Injection (bores)",
  flood: "Flood",
  immersion: "Immersion",
  hot_air_drying: "Hot-air drying",
  vacuum_drying: "Vacuum drying",
};

/** The kinds of cleaning system, as the screens name them. */
export const SYSTEM_KIND_LABELS: Record<string, string> = {
  multi_tank_aqueous: "Multi-tank aqueous washer",
  single_chamber_spray: "Single-chamber spray washer",
  other: "Other",
};
