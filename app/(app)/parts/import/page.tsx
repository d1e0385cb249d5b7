import type { Metadata } from "next";
import { MasterDataImport } from "@/components/parts/master-data-import";
import { secondaryLink } from "@/components/parts/link-styles";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "Import and export master data" };

const EXPORTS = [
  { kind: "part_families", label: "Part families (CSV)" },
  { kind: "specifications", label: "Specifications, every revision (CSV)" },
  { kind: "combinations", label: "Qualified combinations (CSV)" },
] as const;

export default async function PartsImportPage() {
  const user = await requirePageUser("parts.view");
  const manage = can(user.roles, "parts.manage");
  return (
    <>
      <PageHeader
        title="Import and export master data"
        description="Bring a plant's part families and customer specifications in from a spreadsheet, and take the master data out again."
      />
      {manage && (
        <section aria-labelledby="import" className="mb-8 max-w-4xl">
          <h2 id="import" className="mb-1 text-lg font-semibold">
            Import from CSV
          </h2>
          <p className="mb-3 text-sm text-stone-600">
            Every row is checked as the entry form checks it. One bad row and nothing is saved; each
            problem names its line.
          </p>
          <MasterDataImport />
        </section>
      )}
      <section aria-labelledby="export">
        <h2 id="export" className="mb-1 text-lg font-semibold">
          Export
        </h2>
        <p className="mb-3 text-sm text-stone-600">
          CSV files use the import&apos;s column names, so an edited file can be imported again.
        </p>
        <div className="flex flex-wrap gap-2">
          {EXPORTS.map((e) => (
            <a
              key={e.kind}
              href={`/api/parts/export?format=csv&kind=${e.kind}`}
              className={secondaryLink}
              download
            >
              {e.label}
            </a>
          ))}
          <a href="/api/parts/export?format=json" className={secondaryLink} download>
            All master data (JSON)
          </a>
        </div>
      </section>
    </>
  );
}
