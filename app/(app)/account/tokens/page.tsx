import type { Metadata } from "next";
import Link from "next/link";
import { CreateApiTokenForm, RevokeApiTokenForm } from "@/components/account/api-token-forms";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { SCOPE_LABELS } from "@/lib/schemas/api-token";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listApiTokens } from "@/lib/server/api-tokens/queries";
import { formatDate, formatDateTime } from "@/lib/format/date";

export const metadata: Metadata = { title: "API tokens" };

export default async function ApiTokensPage() {
  const user = await requirePageUser("account.manage_tokens");
  const tokens = await listApiTokens(user.id);
  return (
    <>
      <PageHeader
        title="API tokens"
        description={
          <>
            Tokens let lab instruments and scripts use the Washproof API as you, with your roles and never more. A read token never writes. See the{" "}
            <Link href="/api/v1/openapi.json" className="text-brand-800 hover:underline">
              OpenAPI description
            </Link>
            .
          </>
        }
      />
      <section aria-labelledby="new" className="mb-8 rounded-lg border border-stone-200 bg-white p-5">
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
          <table className="w-full text-sm">
            <caption className="sr-only">Your API tokens</caption>
            <thead className="text-left text-xs text-stone-500 uppercase">
              <tr>
                <th className="py-1 pr-3 font-medium">Name</th>
                <th className="py-1 pr-3 font-medium">Starts with</th>
                <th className="py-1 pr-3 font-medium">Scope</th>
                <th className="py-1 pr-3 font-medium">Created</th>
                <th className="py-1 pr-3 font-medium">Last used</th>
                <th className="py-1 pr-3 font-medium">Status</th>
                <th className="py-1 font-medium">
                  <span className="sr-only">Action</span>
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-stone-100">
              {tokens.map((t) => (
                <tr key={t.id}>
                  <td className="py-1.5 pr-3 font-medium">{t.name}</td>
                  <td className="py-1.5 pr-3 font-mono text-xs">{t.prefix}…</td>
                  <td className="py-1.5 pr-3">{SCOPE_LABELS[t.scope]}</td>
                  <td className="py-1.5 pr-3">{formatDateTime(t.createdAt)}</td>
                  <td className="py-1.5 pr-3">{t.lastUsedAt ? formatDateTime(t.lastUsedAt) : "Never"}</td>
                  <td className="py-1.5 pr-3">{t.revokedAt ? `Revoked ${formatDate(t.revokedAt)}` : "Active"}</td>
                  <td className="py-1.5">{!t.revokedAt && <RevokeApiTokenForm tokenId={t.id} name={t.name} />}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </>
  );
}
