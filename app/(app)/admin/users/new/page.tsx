import type { Metadata } from "next";
import { UserForm } from "@/components/admin/user-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { createUserAction } from "../../actions";

export const metadata: Metadata = { title: "Admin · New user" };

export default async function NewUserPage() {
  await requirePageUser("users.manage");
  return (
    <>
      <PageHeader
        title="New user"
        description="Washproof issues a temporary password; the person chooses their own at first sign-in."
      />
      <UserForm action={createUserAction} submitLabel="Create user" />
    </>
  );
}
