"use client";

import { useState } from "react";
import { ChoiceGroup } from "@/components/ui/field";
import { CsvMappingImport } from "@/components/ui/csv-mapping-import";
import { autoMapMasterData, masterDataFields, masterDataNeeds } from "@/lib/plant/csv-master-data";
import { masterDataMappingProblems } from "@/lib/plant/master-data-mapping";

const KINDS = {
  part_families: { what: "part families", note: "Import the specifications they cite first." },
  specifications: {
    what: "specifications",
    note: "Each row is a specification's first revision here; revise later ones on its page.",
  },
} as const;
type Kind = keyof typeof KINDS;

/** Part families or customer specifications from a CSV file, all rows or none. */
export function MasterDataImport() {
  const [kind, setKind] = useState<Kind>("part_families");
  const fields = masterDataFields(kind);
  const needs = masterDataNeeds(kind);
  return (
    <div className="space-y-3">
      <ChoiceGroup
        type="radio"
        name="kind"
        legend="The file holds"
        inline
        value={kind}
        onValueChange={(v) => setKind(v as Kind)}
        options={[
          { value: "part_families", label: "Part families" },
          { value: "specifications", label: "Specifications" },
        ]}
      />
      <CsvMappingImport
        key={kind}
        title={`Import ${KINDS[kind].what} from CSV`}
        fileLabel={`CSV file of ${KINDS[kind].what}`}
        fields={fields}
        autoMap={(headers) => autoMapMasterData(kind, headers)}
        problems={(mapping, headers) => masterDataMappingProblems(kind, mapping, headers)}
        url="/api/parts/import"
        extra={{ kind }}
        hint={
          <>
            One row per {kind === "part_families" ? "part family" : "specification"}, comma or
            semicolon separated, UTF-8. Columns:{" "}
            {fields.map((f, i) => (
              <span key={f.key}>
                {i > 0 && ", "}
                <code>{f.key}</code>
                {needs.includes(f.key) ? "" : " (optional)"}
              </span>
            ))}
            . {KINDS[kind].note} Other names can be mapped below.
          </>
        }
      />
    </div>
  );
}
