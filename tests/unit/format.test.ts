import { afterEach, beforeEach, describe, expect, it } from "vitest";
import {
  dateTimeFieldValue,
  fileStamp,
  formatDate,
  formatDateTime,
  parseUtc,
  todayUtc,
} from "@/lib/format/date";
import {
  formatBytes,
  formatNumber,
  formatSize,
  rangeWithUnit,
  withUnit,
} from "@/lib/format/number";
import { humanize } from "@/lib/format/labels";

// Every stored time is ISO-8601 UTC (DEVELOPERS.md, Database) and the house date format is the
// ISO 8601 calendar date YYYY-MM-DD; the browser tests assert "2026-06-15 07:00 UTC" and
// "… 09:00:00 UTC" in trace.spec.ts and documents.spec.ts.

describe("formatDate", () => {
  it("gives the UTC calendar date of a stored instant [std ISO 8601 §5.2.1.1]", () => {
    expect(formatDate("2026-06-15T07:00:00.000Z")).toBe("2026-06-15");
    expect(formatDate(new Date(Date.UTC(2026, 0, 31, 23, 59)))).toBe("2026-01-31");
  });

  it("keeps a date-only value as it is", () => {
    expect(formatDate("2026-02-28")).toBe("2026-02-28");
  });

  it("converts an instant with an offset to its UTC date [derived: 00:30 at +02:00 is 22:30 UTC the day before]", () => {
    expect(formatDate("2026-03-01T00:30:00+02:00")).toBe("2026-02-28");
  });

  it("gives the fallback for empty or invalid input", () => {
    expect(formatDate(null)).toBe("—");
    expect(formatDate(undefined)).toBe("—");
    expect(formatDate("")).toBe("—");
    expect(formatDate("not a date")).toBe("—");
    expect(formatDate("March 5")).toBe("—");
    expect(formatDate("2026-02-30")).toBe("—");
    expect(formatDate("2026-13-01T00:00:00Z")).toBe("—");
    expect(formatDate(new Date(Number.NaN))).toBe("—");
    expect(formatDate(null, "never recorded")).toBe("never recorded");
  });
});

describe("formatDateTime", () => {
  it("shows minutes and the UTC marker by default", () => {
    expect(formatDateTime("2026-06-15T07:00:00.000Z")).toBe("2026-06-15 07:00 UTC");
  });

  it("shows seconds for signatures and the audit trail", () => {
    expect(formatDateTime("2026-06-10T09:00:05.250Z", { seconds: true })).toBe(
      "2026-06-10 09:00:05 UTC",
    );
  });

  it("leaves the marker off where the column heading carries it", () => {
    expect(formatDateTime("2026-06-10T09:00:05Z", { seconds: true, zone: false })).toBe(
      "2026-06-10 09:00:05",
    );
  });

  it("reads a time without a zone (a datetime-local field) as UTC", () => {
    expect(formatDateTime("2026-11-29T08:00")).toBe("2026-11-29 08:00 UTC");
  });

  it("gives the fallback for empty or invalid input", () => {
    expect(formatDateTime(null)).toBe("—");
    expect(formatDateTime("yesterday", { fallback: "unknown" })).toBe("unknown");
  });
});

describe("the machine's time zone does not matter", () => {
  const saved = process.env.TZ;
  beforeEach(() => {
    // Node re-reads TZ when it changes; a zone far from UTC makes any local-time slip visible.
    process.env.TZ = "Pacific/Kiritimati"; // UTC+14
  });
  afterEach(() => {
    process.env.TZ = saved;
  });

  it("formats in UTC, not local time", () => {
    expect(new Date("2026-06-15T12:00:00Z").getDate()).toBe(16); // the zone really is in force
    expect(formatDate("2026-06-15T12:00:00Z")).toBe("2026-06-15");
    expect(formatDateTime("2026-06-15T12:00:00Z")).toBe("2026-06-15 12:00 UTC");
    expect(formatDateTime("2026-11-29T08:00")).toBe("2026-11-29 08:00 UTC");
    expect(todayUtc(new Date("2026-06-15T23:30:00Z"))).toBe("2026-06-15");
  });
});

describe("parseUtc, todayUtc, fileStamp", () => {
  it("parses only ISO-8601", () => {
    expect(parseUtc("2026-06-15")?.toISOString()).toBe("2026-06-15T00:00:00.000Z");
    expect(parseUtc("1")).toBeNull();
  });

  it("stamps file names without separators or milliseconds", () => {
    expect(fileStamp(new Date("2026-06-15T07:08:09.123Z"))).toBe("20260615T070809Z");
    expect(todayUtc(new Date("2026-12-31T23:59:59Z"))).toBe("2026-12-31");
    expect(dateTimeFieldValue(new Date("2026-06-15T07:08:09.123Z"))).toBe("2026-06-15T07:08");
  });
});

describe("numbers with units", () => {
  it("groups thousands and rounds to the given digits [common practice: en-GB]", () => {
    expect(formatNumber(12345.6789)).toBe("12,345.679");
    expect(formatNumber(0.25, 1)).toBe("0.3");
    expect(formatNumber(2, 2)).toBe("2");
  });

  it("always carries the unit", () => {
    expect(withUnit(60, "°C")).toBe("60 °C");
    expect(withUnit(null, "°C")).toBe("—");
    expect(rangeWithUnit(55, 65, "°C")).toBe("55–65 °C");
    expect(rangeWithUnit(null, 65, "°C")).toBe("≤ 65 °C");
    expect(rangeWithUnit(55, null, "°C")).toBe("≥ 55 °C");
    expect(rangeWithUnit(null, null, "°C")).toBe("not set");
  });

  it("gives file sizes in binary units [std IEC 80000-13 prefixes]", () => {
    expect(formatBytes(1023)).toBe("1023 B");
    expect(formatBytes(1536)).toBe("1.5 KiB");
    expect(formatBytes(5 * 1024 * 1024)).toBe("5.0 MiB");
  });

  it("states an upload size in kB below a megabyte, so a small limit never reads 0 MB", () => {
    expect(formatSize(10 * 1024 + 240)).toBe("10.2 kB");
    expect(formatSize(2 * 1024 * 1024)).toBe("2.0 MB");
  });
});

describe("humanize", () => {
  it("keeps abbreviations in capitals: the test type reads “UV inspection”, not “Uv inspection”", () => {
    expect(humanize("uv_inspection")).toBe("UV inspection");
    expect(humanize("pq_run")).toBe("PQ run");
    expect(humanize("rinse_conductivity")).toBe("Rinse conductivity");
    expect(humanize("particle_cleanliness")).toBe("Particle cleanliness");
  });
});
