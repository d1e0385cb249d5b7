"use client";

import { CsvMappingImport } from "@/components/ui/csv-mapping-import";
import { autoMapCycles, cycleMappingProblems, type CycleCsvField } from "@/lib/cycles/csv";

/** A washer's cycle log through the shared column-mapping import. */
export function CycleImport({ fields }: { fields: CycleCsvField[] }) {
  return (
    <CsvMappingImport
      title="Import a cycle log from CSV"
      fileLabel="Cycle log (CSV)"
      fields={fields}
      autoMap={(headers) => autoMapCycles(headers, fields)}
      problems={(mapping, headers) => cycleMappingProblems(mapping, headers, fields)}
      url="/api/cycles/import"
      hint={
        <>
          One row per cycle. Columns: <code>cycle</code>, <code>system</code>, <code>recipe</code>,{" "}
          <code>version</code> (optional), <code>part_family</code>, <code>lots</code> (separated by
          spaces or semicolons), <code>baskets</code>, <code>start</code>, <code>end</code> (UTC
          unless the time carries a zone), <code>operator</code>, and one column per value named by
          its parameter key, e.g. <code>wash.temperature</code>. Other names can be mapped below.
          All rows are recorded or none.
        </>
      }
    />
  );
}
