import type { Metadata } from "next";
import { HowWeComputeView } from "@/components/how-we-compute/how-we-compute-view";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "How we compute" };

export default async function HowWeComputePage() {
  await requirePageUser("calc.view");
  return <HowWeComputeView />;
}
