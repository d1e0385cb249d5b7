import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { linkButton } from "@/components/parts/link-styles";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDate } from "@/lib/format/date";
import { LAB_METHOD_STATUS_LABELS } from "@/lib/lab-methods/rules";
import { LAB_METHOD_KIND_LABELS } from "@/lib/schemas/lab-method";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listMethods } from "@/lib/server/lab-methods/queries";

export const metadata: Metadata = { title: "Lab methods" };

export default async function LabMethodsPage() {
  const user = await requirePageUser("lab.view");
  const rows = await listMethods();
  return (
    <>
      <PageHeader
        title="Lab methods"
        description="Extraction procedures, analysis methods and gravimetric methods, each version approved by a second person. A test run cites the approved versions it used; signing it performed needs current training on each."
        actions={
          <>
            <IntentLink
              href="/lab/training"
              className="text-sm font-medium text-brand-800 underline"
            >
              Training matrix
            </IntentLink>
            {can(user.roles, "lab.method_draft") && (
              <IntentLink href="/lab/methods/new" className={linkButton}>
                New lab method
              </IntentLink>
            )}
          </>
        }
      />
      <Table caption="Lab methods">
        <THead>
          <Th>Method</Th>
          <Th>Kind</Th>
          <Th>Name</Th>
          <Th>Status</Th>
          <Th>Approved</Th>
          <Th>Drafted by</Th>
        </THead>
        <TBody>
          {rows.length === 0 && <EmptyRow colSpan={6}>No lab method yet.</EmptyRow>}
          {rows.map(({ method: m, author }) => (
            <tr key={m.id}>
              <Td>
                <IntentLink
                  href={`/lab/methods/${m.id}`}
                  className="font-medium text-brand-800 underline"
                >
                  {m.code} v{m.version}
                </IntentLink>
              </Td>
              <Td>{LAB_METHOD_KIND_LABELS[m.kind]}</Td>
              <Td>{m.name}</Td>
              <Td>{LAB_METHOD_STATUS_LABELS[m.status]}</Td>
              <Td>{formatDate(m.approvedAt, "not approved")}</Td>
              <Td>{author}</Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </>
  );
}
