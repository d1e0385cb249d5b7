import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { UserAccessForms } from "@/components/admin/user-access-forms";
import { UserForm } from "@/components/admin/user-form";
import { UserStatus } from "@/components/admin/user-status";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getUser } from "@/lib/server/users/queries";
import { updateUserAction } from "../../actions";

export const metadata: Metadata = { title: "Admin · User" };

export default async function UserPage({ params }: { params: Promise<{ userId: string }> }) {
  const me = await requirePageUser("users.manage");
  const { userId } = await params;
  const user = /^[0-9a-f-]{36}$/.test(userId) ? await getUser(userId) : undefined;
  if (!user) notFound();
  return (
    <>
      <PageHeader title={user.name} description={<UserStatus {...user} />} />
      <div className="grid gap-10 xl:grid-cols-[1fr_24rem]">
        <UserForm action={updateUserAction} user={user} submitLabel="Save changes" />
        <UserAccessForms userId={user.id} active={user.active} isSelf={user.id === me.id} />
      </div>
    </>
  );
}
