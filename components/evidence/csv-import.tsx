"use client";

import { CsvMappingImport } from "@/components/ui/csv-mapping-import";
import {
  autoMapping,
  CSV_FORMATS,
  mappingProblems,
  type ColumnMapping,
  type CsvTestType,
} from "@/lib/evidence/csv-import";

/** Samples of an open run (particle counts or filter weighings) from CSV, through the shared column-mapping import. */
export function CsvImport({ runId, testType }: { runId: string; testType: CsvTestType }) {
  const format = CSV_FORMATS[testType];
  return (
    <CsvMappingImport
      title={`Import ${format.what} from CSV`}
      fileLabel={`CSV file of ${format.what}`}
      fields={format.fields}
      autoMap={(headers) => autoMapping(headers, testType)}
      problems={(mapping, headers) => mappingProblems(mapping as ColumnMapping, headers, testType)}
      url={`/api/evidence/runs/${runId}/import`}
      hint={
        <>
          One row per sample. Columns:{" "}
          {testType === "particle_cleanliness" ? (
            <>
              <code>sample</code>, <code>cycle</code> (the wash cycle id),{" "}
              <code>basket_position</code>, <code>worst_case</code> (yes/no),{" "}
              <code>components</code>, <code>B</code> … <code>N</code> (absolute counts),{" "}
              <code>largest_metallic_um</code>, <code>largest_non_metallic_um</code>,{" "}
              <code>largest_fibre_um</code>.
            </>
          ) : (
            <>
              <code>sample</code>, <code>cycle</code> (the wash cycle id),{" "}
              <code>basket_position</code>, <code>worst_case</code> (yes/no),{" "}
              <code>components</code> (filtered together), <code>filter_before_mg</code>,{" "}
              <code>filter_after_mg</code>, <code>blank_mg</code>.
            </>
          )}{" "}
          Other names can be mapped below.
        </>
      }
    />
  );
}
