import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/server/auth/current-user";
import { landingPath } from "@/lib/overview/state";

export default async function Home() {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  redirect(landingPath(user.roles));
}
