import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { secondaryLink } from "@/components/parts/link-styles";
import { SignatureDialog } from "@/components/signatures/signature-dialog";
import { SignatureList } from "@/components/signatures/signature-list";
import { PageHeader } from "@/components/ui/page-header";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { getDb } from "@/db/client";
import { can } from "@/lib/auth/permissions";
import { formatDate } from "@/lib/format/date";
import { describeMethod } from "@/lib/lab-methods/describe";
import { LAB_METHOD_STATUS_LABELS } from "@/lib/lab-methods/rules";
import { LAB_METHOD_KIND_LABELS } from "@/lib/schemas/lab-method";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { UserFacingError } from "@/lib/server/errors";
import { loadMethod } from "@/lib/server/lab-methods/state";
import { signatureValidity } from "@/lib/signatures/rules";
import { approveMethodAction } from "../actions";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ methodId: string }>;
}): Promise<Metadata> {
  return recordTitle("labMethod", (await params).methodId, "Lab method");
}

export default async function MethodPage({ params }: { params: Promise<{ methodId: string }> }) {
  const user = await requirePageUser("lab.view");
  const { methodId } = await params;
  if (!/^[0-9a-f-]{36}$/.test(methodId)) notFound();
  const view = await loadMethod(getDb(), methodId).catch((error) => {
    if (error instanceof UserFacingError && error.kind === "not_found") notFound();
    throw error;
  });
  const m = view.method;
  const label = `${m.code} v${m.version}`;
  const canApprove =
    m.status === "draft" && m.createdBy !== user.id && can(user.roles, "lab.method_approve");
  const hasDraft = view.versions.some((v) => v.status === "draft");
  return (
    <>
      <PageHeader
        title={`${label} ${m.name}`}
        description={`${LAB_METHOD_KIND_LABELS[m.kind]}, drafted by ${view.author} on ${formatDate(m.createdAt)}.`}
        actions={
          m.status === "approved" && !hasDraft && can(user.roles, "lab.method_draft") ? (
            <IntentLink href={`/lab/methods/new?from=${m.id}`} className={secondaryLink}>
              Draft a new version
            </IntentLink>
          ) : undefined
        }
      />
      <p className="mb-4 text-sm">
        Status: <span className="font-semibold">{LAB_METHOD_STATUS_LABELS[m.status]}</span>
        {m.status === "draft"
          ? " — waiting for an approver's signature; no run may cite it yet."
          : ""}
        {m.status === "approved" ? " — runs may cite this version." : ""}
        {m.status === "superseded"
          ? " — a later version replaced it; runs that cited it keep it."
          : ""}
      </p>
      <Table
        caption="Method fields"
        captionVisible
        density="compact"
        frameClassName="mb-6 max-w-3xl"
      >
        <THead>
          <Th>Field</Th>
          <Th>Value</Th>
        </THead>
        <TBody>
          {describeMethod(m.kind, m.details).map(([k, v]) => (
            <tr key={k}>
              <Th scope="row">{k}</Th>
              <Td>{v}</Td>
            </tr>
          ))}
          <tr>
            <Th scope="row">Training interval</Th>
            <Td>{m.trainingIntervalMonths} months</Td>
          </tr>
          {m.kind === "extraction" && (
            <tr>
              <Th scope="row">Declining-test qualification</Th>
              <Td>
                {view.qualification ? (
                  <IntentLink
                    href={`/evidence/runs/${view.qualification.id}`}
                    className="text-brand-800 underline"
                  >
                    {view.qualification.number}
                  </IntentLink>
                ) : (
                  "not yet qualified"
                )}
              </Td>
            </tr>
          )}
        </TBody>
      </Table>

      <section aria-labelledby="signatures" className="mb-6">
        <h2 id="signatures" className="mb-2 text-lg font-semibold">
          Signatures
        </h2>
        <SignatureList
          signatures={view.signatures.map((s) => ({
            ...s,
            validity: signatureValidity(s.contentHash, view.contentHash),
          }))}
        />
        <p className="mt-2 font-mono text-xs break-all text-stone-500">
          Content hash {view.contentHash}
        </p>
        {canApprove && (
          <div className="mt-3">
            <SignatureDialog
              action={approveMethodAction}
              meaning="approved"
              recordType="lab_method"
              signerName={user.name}
              recordLabel={label}
              contentHash={view.contentHash}
              hidden={{ methodId: m.id }}
              buttonLabel="Approve method"
            />
          </div>
        )}
      </section>

      <Table caption="Versions" captionVisible density="compact" frameClassName="max-w-3xl">
        <THead>
          <Th>Version</Th>
          <Th>Status</Th>
          <Th>Approved</Th>
        </THead>
        <TBody>
          {view.versions.map((v) => (
            <tr key={v.id}>
              <Td>
                <IntentLink href={`/lab/methods/${v.id}`} className="text-brand-800 underline">
                  {m.code} v{v.version}
                </IntentLink>
              </Td>
              <Td>{LAB_METHOD_STATUS_LABELS[v.status]}</Td>
              <Td>{formatDate(v.approvedAt, "not approved")}</Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </>
  );
}
