import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { autoMapping, parseSampleCsv, YIELD_EVERY_ROWS } from "@/lib/evidence/csv-import";

const HEADER =
  "sample,basket_position,worst_case,components,B,C,D,E,F,G,H,I,J,K,L,M,N,largest_metallic_um";

describe("particle CSV import", () => {
  it("reads a valid file in our format", async () => {
    const csv = `${HEADER}\nVB-1,top,yes,3,,,,14,6,,1,,,,,,,350\nVB-2,centre,no,1,4200,1800,900,260,70,25,9,1,0,0,0,0,0,300\n`;
    const r = await parseSampleCsv(csv);
    expect(r.fileErrors).toEqual([]);
    expect(r.errors).toEqual([]);
    expect(r.rowCount).toBe(2);
    expect(r.rows[0]).toMatchObject({
      sampleLabel: "VB-1",
      basketPosition: "top",
      worstCase: true,
      components: 3,
      counts: { E: 14, F: 6, H: 1 },
      largest: { metallicUm: 350 },
    });
  });

  it("lists every bad row with its line and keeps no rows", async () => {
    const csv = `${HEADER}\nVB-1,,,1,,,,abc,,,,,,,,,,\nVB-2,,,1,,,,-3,,,,,,,,,,\nVB-3,,,0,,,,5,,,,,,,,,,\nVB-3,,,1,,,,5,,,,,,,,,,\nVB-3,,,1,,,,5,,,,,,,,,,\n`;
    const r = await parseSampleCsv(csv);
    expect(r.rows).toEqual([]);
    const lines = r.errors.map((e) => e.line);
    expect(lines).toEqual(expect.arrayContaining([2, 3, 4, 6]));
    expect(r.errors.find((e) => e.line === 2)!.message).toMatch(/Class E count must be a number/);
    expect(r.errors.find((e) => e.line === 3)!.message).toMatch(/starts with "-"/);
    expect(r.errors.find((e) => e.line === 6)!.message).toMatch(/appears twice/);
  });

  it("refuses text the database would not give back as written, naming the line", async () => {
    // A NUL would be stored but read back cut short; a lone surrogate would come back as U+FFFD.
    const r = await parseSampleCsv(
      `${HEADER}\nVB-1\u0000x,,,1,,,,5,,,,,,,,,,\nVB-2,top\ud800,,1,,,,5,,,,,,,,,,\nVB-3,left \u202e,,1,,,,5,,,,,,,,,,\n`,
    );
    expect(r.rows).toEqual([]);
    expect(r.errors.map((e) => e.line)).toEqual([2, 3]);
    expect(r.errors[0].message).toMatch(/control characters/);
    expect(r.errors[1].message).toMatch(/broken character/);
  });

  it("refuses cells that a spreadsheet would run as formulas", async () => {
    const r = await parseSampleCsv(
      `${HEADER}\n=HYPERLINK(1),,,1,,,,5,,,,,,,,,,\n@SUM(A1),,,1,,,,5,,,,,,,,,,\nVB-3,+1,,1,,,,5,,,,,,,,,,\n`,
    );
    expect(r.rows).toEqual([]);
    expect(r.errors.filter((e) => /formula/.test(e.message)).map((e) => e.line)).toEqual([2, 3, 4]);
  });

  it("names what is missing when the columns are not ours, and imports after mapping", async () => {
    const csv = "Part No;Pos;Cnt 50-100;Cnt 100-150\nVB-9;top;14;6\n";
    const unmapped = await parseSampleCsv(csv);
    expect(unmapped.fileErrors.join(" ")).toMatch(/No column holds the sample/);
    expect(unmapped.headers).toEqual(["Part No", "Pos", "Cnt 50-100", "Cnt 100-150"]);
    const mapped = await parseSampleCsv(csv, {
      mapping: { sample: "Part No", basket_position: "Pos", E: "Cnt 50-100", F: "Cnt 100-150" },
    });
    expect(mapped.fileErrors).toEqual([]);
    expect(mapped.rows[0]).toMatchObject({
      sampleLabel: "VB-9",
      basketPosition: "top",
      counts: { E: 14, F: 6 },
    });
  });

  it("maps our names case-insensitively", () => {
    expect(autoMapping(["Sample", "e", "Largest_Fibre_um"])).toEqual({
      sample: "Sample",
      E: "e",
      largest_fibre_um: "Largest_Fibre_um",
    });
  });

  it("reports an empty file and a file with only a header", async () => {
    expect((await parseSampleCsv("")).fileErrors[0]).toMatch(/empty/);
    expect((await parseSampleCsv(`${HEADER}\n`)).fileErrors[0]).toMatch(/no data rows/);
  });

  it("streams a 100,000-row file without holding it whole", async () => {
    const rows = 100_000;
    let i = 0;
    let bytes = 0;
    let validated = 0;
    let validatedWhenLastChunkWasRead = -1;
    const stream = new Readable({
      read() {
        if (i === 0) this.push(`${HEADER}\n`);
        let chunk = "";
        for (let k = 0; k < 1000 && i < rows; k++, i++)
          chunk += `S-${i},,no,1,${i % 5000},300,120,40,9,2,1,0,0,0,0,0,0,250\n`;
        bytes += chunk.length;
        if (i === rows && validatedWhenLastChunkWasRead < 0)
          validatedWhenLastChunkWasRead = validated;
        this.push(chunk === "" ? null : chunk);
      },
    });
    const started = performance.now();
    const r = await parseSampleCsv(stream, { collect: false, onRow: (n) => (validated = n) });
    const seconds = (performance.now() - started) / 1000;
    expect(r.rowCount).toBe(rows);
    expect(r.errorCount).toBe(0);
    expect(r.fileErrors).toEqual([]);
    expect(bytes).toBeGreaterThan(5_000_000);
    // Rows were validated while the file was still being read: it was never held whole.
    expect(validatedWhenLastChunkWasRead).toBeGreaterThan(rows * 0.9);
    console.log(
      `100,000-row CSV (${(bytes / 1e6).toFixed(1)} MB) validated in ${seconds.toFixed(2)} s`,
    );
  }, 60_000);
});

describe("gravimetric CSV import", () => {
  it("reads filter weighings in our format, with the same rules as the entry form", async () => {
    const csv =
      "sample,worst_case,components,filter_before_mg,filter_after_mg,blank_mg\nVB-1,yes,1,12.40,13.30,0.05\nVB-2,no,,12.10,11.90,\n";
    const r = await parseSampleCsv(csv, { testType: "gravimetric" });
    expect(r.rows).toEqual([]);
    expect(r.errors).toEqual([
      {
        line: 3,
        message: "The filter after filtration cannot be lighter than before; check the weighing.",
      },
    ]);
    const good = await parseSampleCsv(csv.replace("11.90", "12.95"), { testType: "gravimetric" });
    expect(good.errors).toEqual([]);
    // An empty component count is 1, as in the particle format.
    expect(good.rows).toEqual([
      {
        sampleLabel: "VB-1",
        worstCase: true,
        components: 1,
        filterBeforeMg: 12.4,
        filterAfterMg: 13.3,
        blankMg: 0.05,
      },
      {
        sampleLabel: "VB-2",
        worstCase: false,
        components: 1,
        filterBeforeMg: 12.1,
        filterAfterMg: 12.95,
      },
    ]);
  });

  it("asks for both weighings before reading a row, and imports after mapping", async () => {
    const csv = "Part;Tare (mg);Gross (mg)\nVB-7;12.00;12.80\n";
    const unmapped = await parseSampleCsv(csv, { testType: "gravimetric" });
    expect(unmapped.fileErrors).toEqual([
      'No column holds the sample (part serial): name one "sample" or map it.',
      'No column holds the filter mass before filtration: name one "filter_before_mg" or map it.',
      'No column holds the filter mass after filtration: name one "filter_after_mg" or map it.',
    ]);
    expect(autoMapping(["Sample", "Tare_mg", "after_mg", "E"], "gravimetric")).toEqual({
      sample: "Sample",
      filter_before_mg: "Tare_mg",
      filter_after_mg: "after_mg",
    });
    const mapped = await parseSampleCsv(csv, {
      testType: "gravimetric",
      mapping: { sample: "Part", filter_before_mg: "Tare (mg)", filter_after_mg: "Gross (mg)" },
    });
    expect(mapped.rows).toEqual([
      {
        sampleLabel: "VB-7",
        worstCase: false,
        components: 1,
        filterBeforeMg: 12,
        filterAfterMg: 12.8,
      },
    ]);
  });
});

describe("a large file does not hold the server", () => {
  it("lets other work run between batches of validated rows (a file already in memory is parsed in one go otherwise)", async () => {
    const rows = 3000;
    const csv = [
      HEADER,
      ...Array.from(
        { length: rows },
        (_, i) => `S-${i},,no,1,${i % 5000},300,120,40,9,2,1,0,0,0,0,0,0,250`,
      ),
    ].join("\n");
    let turns = 0;
    let running = true;
    const tick = () => {
      turns += 1;
      if (running) setImmediate(tick);
    };
    setImmediate(tick);
    const r = await parseSampleCsv(csv, { collect: false });
    running = false;
    expect(r.rowCount).toBe(rows);
    // One turn of the event loop at least per batch of rows: other requests are answered meanwhile.
    expect(turns).toBeGreaterThanOrEqual(rows / YIELD_EVERY_ROWS - 1);
  });
});
