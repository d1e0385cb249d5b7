import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { plantNeedsSetUp } from "@/lib/server/plant/set-up-plant";
import { SetUpForm } from "./set-up-form";

export const metadata: Metadata = { title: "Set up Washproof" };
// Whether anyone exists is read at every request, never at build time.
export const dynamic = "force-dynamic";

/** Open only while the installation has no user; afterwards everyone signs in. */
export default async function SetUpPage() {
  if (!(await plantNeedsSetUp())) redirect("/sign-in");
  return (
    <>
      <h1 className="mb-1 text-xl font-semibold text-stone-900">Set up Washproof</h1>
      <p className="mb-6 text-sm text-stone-600">
        This installation has no users yet. Name the company and its site, and create the first
        administrator, who then adds the washers, the other users and their roles. This page closes
        once it has been used.
      </p>
      <SetUpForm />
    </>
  );
}
