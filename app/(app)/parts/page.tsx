import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { linkButton } from "@/components/parts/link-styles";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { withUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listPartFamilies } from "@/lib/server/plant/queries";

export const metadata: Metadata = { title: "Parts & specifications" };

export default async function PartsPage() {
  const user = await requirePageUser("parts.view");
  const manage = can(user.roles, "parts.manage");
  const families = await listPartFamilies();
  return (
    <>
      <PageHeader
        title="Parts & specifications"
        description="Part families with their wetted surface and the cleanliness specification each must meet."
        actions={
          manage ? (
            <IntentLink href="/parts/families/new" className={linkButton}>
              New part family
            </IntentLink>
          ) : undefined
        }
      />
      {families.length === 0 ? (
        <EmptyState title="No part families">
          Engineers add part families with their material, wetted area and specification, by hand or
          from a CSV file.
        </EmptyState>
      ) : (
        <Table caption="Part families">
          <THead>
            <Th>Code</Th>
            <Th>Name</Th>
            <Th>Part numbers</Th>
            <Th>Material</Th>
            <Th align="right">Wetted area</Th>
            <Th>Customer</Th>
            <Th>Drawing</Th>
            <Th>Specification</Th>
          </THead>
          <TBody>
            {families.map(({ family, spec }) => (
              <tr key={family.id}>
                <Td className="font-mono text-xs">
                  <IntentLink
                    href={`/parts/families/${family.id}`}
                    className="text-brand-800 underline"
                  >
                    {family.code}
                  </IntentLink>
                </Td>
                <Td>{family.name}</Td>
                <Td className="text-xs">{family.partNumbers.join(", ") || "—"}</Td>
                <Td>{family.material}</Td>
                <Td numeric>{withUnit(family.wettedAreaCm2, "cm²")}</Td>
                <Td>{family.customer ?? "—"}</Td>
                <Td>
                  {family.drawingNumber
                    ? `${family.drawingNumber}${family.drawingRevision ? ` rev ${family.drawingRevision}` : ""}`
                    : "—"}
                </Td>
                <Td>
                  <IntentLink href={`/parts/specs/${spec.id}`} className="text-brand-800 underline">
                    {spec.code} rev {spec.revision}
                  </IntentLink>
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
      )}
    </>
  );
}
