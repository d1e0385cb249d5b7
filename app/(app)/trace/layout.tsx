import type { ReactNode } from "react";
import { SubNav } from "@/components/shell/sub-nav";
import { can } from "@/lib/auth/permissions";
import { getCurrentUser } from "@/lib/server/auth/current-user";

export default async function TraceLayout({ children }: { children: ReactNode }) {
  const user = await getCurrentUser();
  const items = [
    { href: "/trace", label: "Parameter history" },
    { href: "/trace/part-families", label: "Part families" },
  ];
  if (user && can(user.roles, "audit.view"))
    items.push({ href: "/trace/audit", label: "Audit trail" });
  return (
    <>
      <SubNav label="Trace" items={items} />
      {children}
    </>
  );
}
