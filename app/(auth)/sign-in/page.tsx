import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/server/auth/current-user";
import { plantNeedsSetUp } from "@/lib/server/plant/set-up-plant";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<{ "set-up"?: string }>;
}) {
  if (await getCurrentUser()) redirect("/");
  // An empty installation has nobody to sign in: its first administrator is created first.
  if (await plantNeedsSetUp()) redirect("/set-up");
  const justSetUp = (await searchParams)["set-up"] === "done";
  return (
    <>
      {justSetUp && (
        <p
          role="status"
          className="mb-4 rounded-md border border-brand-300 bg-brand-50 px-3 py-2 text-sm text-brand-900"
        >
          The installation is set up. Sign in as its administrator.
        </p>
      )}
      <h1 className="mb-1 text-xl font-semibold text-stone-900">Sign in</h1>
      <p className="mb-6 text-sm text-stone-600">
        Use the e-mail address and password your administrator gave you.
      </p>
      <SignInForm />
    </>
  );
}
