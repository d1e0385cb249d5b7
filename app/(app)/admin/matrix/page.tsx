import type { Metadata } from "next";
import { MatrixEditor } from "@/components/admin/matrix-editor";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getMatrixPage } from "@/lib/server/changes/queries";
import { saveMatrixAction } from "./actions";
import { formatDate } from "@/lib/format/date";

export const metadata: Metadata = { title: "Admin · Requalification matrix" };

export default async function MatrixPage() {
  await requirePageUser("matrix.manage");
  const { matrix, versions } = await getMatrixPage();
  return (
    <>
      <PageHeader
        title="Requalification matrix"
        description={`Which tests a major change calls for, and at what confidence and reliability (sample size by the success-run theorem). ${matrix ? `Version ${matrix.version} is in force.` : "No version yet."}`}
      />
      <MatrixEditor action={saveMatrixAction} rows={matrix?.rows ?? []} />
      <section aria-labelledby="history" className="mt-8">
        <h2 id="history" className="mb-2 text-base font-semibold">
          Versions
        </h2>
        <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm">
          {versions.map((v) => (
            <li key={v.id} className="px-3 py-2">
              Version {v.version} · {v.status === "effective" ? "In force" : "Superseded"} ·{" "}
              {formatDate(v.createdAt)} · {v.note}
            </li>
          ))}
        </ul>
      </section>
    </>
  );
}
