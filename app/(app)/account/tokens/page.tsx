import type { Metadata } from "next";
import Link from "next/link";
import { CreateApiTokenForm, RevokeApiTokenForm } from "@/components/account/api-token-forms";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { SCOPE_LABELS } from "@/lib/schemas/api-token";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listApiTokens } from "@/lib/server/api-tokens/queries";
import { formatUtc } from "@/lib/trace/labels";

export const metadata: Metadata = { title: "API tokens" };

function tokenStatus(t: { revokedAt: string | null; suspendedAt: string | null; suspendedReason: string | null; expiresAt: string | null }, now: string) {
  if (t.revokedAt) return `Revoked ${t.revokedAt.slice(0, 10)}`;
  if (t.suspendedAt) return `Suspended ${t.suspendedAt.slice(0, 10)}: ${t.suspendedReason ?? "access changed"}`;
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
                <th className="py-1 pr-3 font-medium">Expires</th>
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
                  <td className="py-1.5 pr-3">{formatUtc(t.createdAt)}</td>
                  <td className="py-1.5 pr-3">{t.lastUsedAt ? formatUtc(t.lastUsedAt) : "Never"}</td>
                  <td className="py-1.5 pr-3">{t.expiresAt ? t.expiresAt.slice(0, 10) : "—"}</td>
                  <td className="py-1.5 pr-3">{tokenStatus(t, now)}</td>
                  <td className="py-1.5">{tokenStatus(t, now) === "Active" && <RevokeApiTokenForm tokenId={t.id} name={t.name} />}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </>
  );
}
