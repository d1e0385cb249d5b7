import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/server/auth/current-user";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage() {
  if (await getCurrentUser()) redirect("/");
  return (
    <>
      <h1 className="mb-1 text-xl font-semibold text-stone-900">Sign in</h1>
      <p className="mb-6 text-sm text-stone-600">Use the e-mail address and password your administrator gave you.</p>
      <SignInForm />
    </>
  );
}
