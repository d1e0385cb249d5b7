import type { Metadata } from "next";
import Link from "next/link";
import { UserStatus } from "@/components/admin/user-status";
import { PageHeader } from "@/components/ui/page-header";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listUsers } from "@/lib/server/users/queries";

export const metadata: Metadata = { title: "Admin · Users" };

export default async function AdminPage() {
  await requirePageUser("admin.view");
  const users = await listUsers();
  return (
    <>
      <PageHeader
        title="Users and roles"
        description="People who use Washproof and what each may do. Users are deactivated, never deleted: their signatures and history stay theirs."
        actions={
          <Link href="/admin/users/new" className="rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800">
            New user
          </Link>
        }
      />
      <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
        <table className="w-full text-sm">
          <caption className="sr-only">Users</caption>
          <thead className="bg-stone-50 text-left text-xs text-stone-500 uppercase">
            <tr>
              <th className="px-3 py-2 font-medium">Name</th>
              <th className="px-3 py-2 font-medium">E-mail</th>
              <th className="px-3 py-2 font-medium">Roles</th>
              <th className="px-3 py-2 font-medium">Status</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-stone-100">
            {users.map((u) => (
              <tr key={u.id}>
                <td className="px-3 py-2">
                  <Link href={`/admin/users/${u.id}`} className="font-medium text-brand-800 hover:underline">
                    {u.name}
                  </Link>
                  {u.jobTitle && <span className="block text-xs text-stone-500">{u.jobTitle}</span>}
                </td>
                <td className="px-3 py-2">{u.email}</td>
                <td className="px-3 py-2">{u.roles.map((r) => ROLE_LABELS[r]).join(", ")}</td>
                <td className="px-3 py-2">
                  <UserStatus {...u} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
