import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { UserStatus } from "@/components/admin/user-status";
import { PageHeader } from "@/components/ui/page-header";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listUsers } from "@/lib/server/users/queries";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

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
          <IntentLink
            href="/admin/users/new"
            className="rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800"
          >
            New user
          </IntentLink>
        }
      />
      <Table caption="Users">
        <THead>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th>Roles</Th>
          <Th>Status</Th>
        </THead>
        <TBody>
          {users.map((u) => (
            <tr key={u.id}>
              <Td>
                <IntentLink
                  href={`/admin/users/${u.id}`}
                  className="font-medium text-brand-800 hover:underline"
                >
                  {u.name}
                </IntentLink>
                {u.jobTitle && <span className="block text-xs text-stone-500">{u.jobTitle}</span>}
              </Td>
              <Td>{u.email}</Td>
              <Td>{u.roles.map((r) => ROLE_LABELS[r]).join(", ")}</Td>
              <Td>
                <UserStatus {...u} />
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </>
  );
}
