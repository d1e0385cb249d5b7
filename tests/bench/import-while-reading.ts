/**
 * A large CSV import with reads beside it: one technician imports a 100,000-row file of filter
 * weighings into an open run while an engineer keeps loading the evidence table, one request after
 * another. The figure is how long each of those reads took while the import ran: before the import
 * yielded between batches, every other request waited for the whole import (about 26 s).
 */
export interface ImportWhileReading {
  rows: number;
  megabytes: number;
  importStatus: number;
  importMessage: string;
  importSeconds: number;
  reads: number;
  failedReads: number;
  p50: number;
  p95: number;
  max: number;
}

/** Gravimetric rows (our CSV format's column names): invented weighings, each after ≥ before. */
export function weighingsCsv(rows: number): string {
  const lines = ["sample,components,filter_before_mg,filter_after_mg"];
  for (let i = 0; i < rows; i++)
    lines.push(
      `IMP-${String(i).padStart(6, "0")},1,${(100 + (i % 50) / 10).toFixed(1)},${(100.4 + (i % 50) / 10).toFixed(1)}`,
    );
  return `${lines.join("\n")}\n`;
}

const quantile = (sorted: number[], q: number) =>
  sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] : NaN;

export async function measureImportWhileReading(opts: {
  base: string;
  runId: string;
  importCookie: string;
  readCookie: string;
  readPath: string;
  rows: number;
}): Promise<ImportWhileReading> {
  const csv = weighingsCsv(opts.rows);
  const form = new FormData();
  form.set("file", new File([csv], "weighings.csv", { type: "text/csv" }));
  const latencies: number[] = [];
  let failedReads = 0;
  let importing = true;
  const started = performance.now();
  const importDone = fetch(`${opts.base}/api/evidence/runs/${opts.runId}/import`, {
    method: "POST",
    body: form,
    headers: { cookie: opts.importCookie, origin: opts.base },
  })
    .then(async (res) => ({
      status: res.status,
      message: String(((await res.json()) as { message?: string; error?: string }).message ?? ""),
    }))
    .finally(() => {
      importing = false;
    });
  // Reads one after another for as long as the import runs (bounded: at most 10 minutes).
  const reader = (async () => {
    while (importing && performance.now() - started < 600_000) {
      const t0 = performance.now();
      const res = await fetch(opts.base + opts.readPath, { headers: { cookie: opts.readCookie } });
      await res.arrayBuffer();
      if (!res.ok) failedReads++;
      if (importing) latencies.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  const result = await importDone;
  const importSeconds = (performance.now() - started) / 1000;
  await reader;
  const sorted = [...latencies].sort((a, b) => a - b);
  return {
    rows: opts.rows,
    megabytes: Buffer.byteLength(csv) / 1e6,
    importStatus: result.status,
    importMessage: result.message,
    importSeconds,
    reads: latencies.length,
    failedReads,
    p50: quantile(sorted, 0.5),
    p95: quantile(sorted, 0.95),
    max: sorted.at(-1) ?? NaN,
  };
}
