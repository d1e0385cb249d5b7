import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { z } from "zod";
import { linkButton, secondaryLink } from "@/components/parts/link-styles";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDate } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listSpecRegister } from "@/lib/server/plant/parts-queries";

export const metadata: Metadata = { title: "Specification register" };

const querySchema = z.object({
  status: z.enum(["in_force", "superseded", "all"]).catch("in_force"),
  q: z.string().max(100).catch(""),
});
const STATUS_WORDS = { in_force: "In force", superseded: "Superseded" } as const;

/** The customer specification register; the filter lives in the URL so a filtered list can be linked. */
export default async function SpecRegisterPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("parts.view");
  const raw = await searchParams;
  const query = querySchema.parse({
    status: raw.status ?? "in_force",
    q: typeof raw.q === "string" ? raw.q : "",
  });
  const specs = await listSpecRegister(query);
  return (
    <>
      <PageHeader
        title="Specification register"
        description="Customer cleanliness specifications by revision. A new revision supersedes the one in force; runs keep the revision they were tested against."
        actions={
          can(user.roles, "parts.manage") ? (
            <IntentLink href="/parts/specs/new" className={linkButton}>
              New specification
            </IntentLink>
          ) : undefined
        }
      />
      <form
        method="get"
        className="mb-4 flex flex-wrap items-end gap-3"
        aria-label="Filter specifications"
      >
        <SelectField
          name="status"
          label="Status"
          dense
          defaultValue={query.status}
          options={[
            { value: "in_force", label: "In force" },
            { value: "superseded", label: "Superseded" },
            { value: "all", label: "All revisions" },
          ]}
        />
        <Field
          name="q"
          type="search"
          label="Word in code, title, customer or document"
          dense
          defaultValue={query.q}
        />
        <Button type="submit" variant="secondary">
          Filter
        </Button>
        {(query.q || query.status !== "in_force") && (
          <IntentLink href="/parts/specs" className={secondaryLink}>
            Clear
          </IntentLink>
        )}
      </form>
      <Table caption="Specifications">
        <THead>
          <Th>Code</Th>
          <Th>Revision</Th>
          <Th>Status</Th>
          <Th>Title</Th>
          <Th>Customer</Th>
          <Th>Document</Th>
          <Th>Cleanliness code</Th>
          <Th>Registered</Th>
        </THead>
        <TBody>
          {specs.length === 0 && <EmptyRow colSpan={8}>No specification matches.</EmptyRow>}
          {specs.map((s) => (
            <tr key={s.id}>
              <Td className="font-mono text-xs">
                <IntentLink href={`/parts/specs/${s.id}`} className="text-brand-800 underline">
                  {s.code}
                </IntentLink>
              </Td>
              <Td>{s.revision}</Td>
              <Td>{STATUS_WORDS[s.status]}</Td>
              <Td>{s.name}</Td>
              <Td>{s.customer ?? "—"}</Td>
              <Td>{s.documentNumber ?? "—"}</Td>
              <Td className="font-mono text-xs">{s.ccc}</Td>
              <Td>{formatDate(s.createdAt)}</Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </>
  );
}
