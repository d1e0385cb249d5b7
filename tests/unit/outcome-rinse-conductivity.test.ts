import { describe, expect, it } from "vitest";
import { rinseConductivityOutcome } from "@/lib/evidence/outcomes/rinse-conductivity";
import { conductivitySampleSchema } from "@/lib/schemas/evidence";

const sample = (measured: string, temperature: string) => ({
  sampleLabel: "R-1",
  worstCase: false,
  data: conductivitySampleSchema.parse({
    sampleLabel: "R-1",
    measuredUsPerCm: measured,
    temperatureC: temperature,
  }),
});

describe("rinse conductivity outcome", () => {
  it("compensates to 25 °C before comparing with the limit", () => {
    // [practice] linear compensation, α = 2 %/°C: 22 / (1 + 0.02 × 10) = 18.33 µS/cm ≤ 20
    const out = rinseConductivityOutcome({
      conductivityLimitUsPerCm: 20,
      samples: [sample("22", "35")],
    });
    expect(out.samples[0].lines).toEqual([
      "22 µS/cm at 35 °C → 18.3 µS/cm at 25 °C (linear, α = 2 %/°C, instrument practice)",
      "Limit 20 µS/cm at 25 °C: pass",
    ]);
    expect(out.outcome).toBe("pass");
  });

  it("warns below about 1 µS/cm that pure-water compensation applies", () => {
    // [practice] 0.8 µS/cm at 25 °C stays 0.8; below 1 µS/cm (ISO 3696 grade 2 is ≤ 1.0 µS/cm [std]) linear compensation does not hold
    const out = rinseConductivityOutcome({
      conductivityLimitUsPerCm: 5,
      samples: [sample("0.8", "25")],
    });
    expect(out.samples[0].lines[1]).toMatch(
      /^Below about 1 µS\/cm the linear 2 %\/°C compensation does not hold: pure-water compensation applies/,
    );
    const clean = rinseConductivityOutcome({
      conductivityLimitUsPerCm: 20,
      samples: [sample("22", "35")],
    });
    expect(clean.samples[0].lines.join(" ")).not.toMatch(/pure-water/);
  });

  it("fails a rinse above the limit once compensated", () => {
    // [practice] 26 / 1.2 = 21.7 µS/cm > 20
    expect(
      rinseConductivityOutcome({ conductivityLimitUsPerCm: 20, samples: [sample("26", "35")] })
        .outcome,
    ).toBe("fail");
  });

  it("is incomplete when the recipe version sets no limit", () => {
    const out = rinseConductivityOutcome({
      conductivityLimitUsPerCm: null,
      samples: [sample("5", "25")],
    });
    expect(out.missing).toEqual(["The recipe version sets no rinse-water conductivity limit."]);
    expect(out.outcome).toBe("incomplete");
  });
});
