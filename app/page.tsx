import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/server/auth/current-user";
import { can } from "@/lib/auth/permissions";

export default async function Home() {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  redirect(can(user.roles, "queue.view") ? "/queue" : "/systems");
}
