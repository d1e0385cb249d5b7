import type { ReactNode } from "react";
import { SubNav } from "@/components/shell/sub-nav";

export default function AdminLayout({ children }: { children: ReactNode }) {
  return (
    <>
      <SubNav
        label="Administration"
        items={[
          { href: "/admin", label: "Users and roles", alsoCurrentUnder: ["/admin/users"] },
          { href: "/admin/matrix", label: "Requalification matrix" },
          { href: "/admin/change-control", label: "Change control" },
          { href: "/admin/shifts", label: "Shifts" },
          { href: "/admin/email", label: "E-mail" },
        ]}
      />
      {children}
    </>
  );
}
