import type { Metadata } from "next";
import { CreateApiTokenForm, RevokeApiTokenForm } from "@/components/account/api-token-forms";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { SCOPE_LABELS } from "@/lib/schemas/api-token";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listApiTokens } from "@/lib/server/api-tokens/queries";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "API tokens" };

function tokenStatus(
  t: {
    revokedAt: string | null;
    suspendedAt: string | null;
    suspendedReason: string | null;
    expiresAt: string | null;
  },
  now: string,
) {
  if (t.revokedAt) return `Revoked ${formatDate(t.revokedAt)}`;
  if (t.suspendedAt)
    return `Suspended ${formatDate(t.suspendedAt)}: ${t.suspendedReason ?? "access changed"}`;
  if (!t.expiresAt || t.expiresAt <= now) return "Expired";
  return "Active";
}

export default async function ApiTokensPage() {
  const user = await requirePageUser("account.manage_tokens");
  const tokens = await listApiTokens(user.id);
  const now = new Date().toISOString();
  return (
    <>
      <PageHeader
        title="API tokens"
        description={
          <>
            Tokens let lab instruments and scripts use the Washproof API as you, with your roles and
            never more. A read token never writes. See the{" "}
            {/* A JSON document, not a page: a plain link, which the router never prefetches (its prefetch hung). */}
            <a href="/api/v1/openapi.json" className="text-brand-800 hover:underline">
              OpenAPI description
            </a>
            .
          </>
        }
      />
      <section
        aria-labelledby="new"
        className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
      >
        <h2 id="new" className="mb-3 text-base font-semibold">
          Create a token
        </h2>
        <CreateApiTokenForm canWrite={can(user.roles, "evidence.record")} />
      </section>
      <section aria-labelledby="list">
        <h2 id="list" className="mb-2 text-base font-semibold">
          Your tokens
        </h2>
        {tokens.length === 0 ? (
          <p className="text-sm text-stone-600">You have no tokens.</p>
        ) : (
          <Table caption="Your API tokens">
            <THead>
              <Th>Name</Th>
              <Th>Starts with</Th>
              <Th>Scope</Th>
              <Th>Created</Th>
              <Th>Last used</Th>
              <Th>Expires</Th>
              <Th>Status</Th>
              <Th>
                <span className="sr-only">Action</span>
              </Th>
            </THead>
            <TBody>
              {tokens.map((t) => (
                <tr key={t.id}>
                  <Td className="font-medium">{t.name}</Td>
                  <Td className="font-mono text-xs">{t.prefix}…</Td>
                  <Td>{SCOPE_LABELS[t.scope]}</Td>
                  <Td>{formatDateTime(t.createdAt)}</Td>
                  <Td>{t.lastUsedAt ? formatDateTime(t.lastUsedAt) : "Never"}</Td>
                  <Td>{t.expiresAt ? formatDate(t.expiresAt) : "—"}</Td>
                  <Td>{tokenStatus(t, now)}</Td>
                  <Td>
                    {tokenStatus(t, now) === "Active" && (
                      <RevokeApiTokenForm tokenId={t.id} name={t.name} />
                    )}
                  </Td>
                </tr>
              ))}
            </TBody>
          </Table>
        )}
      </section>
    </>
  );
}
