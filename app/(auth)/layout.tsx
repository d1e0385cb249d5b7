import type { ReactNode } from "react";
import { Logo } from "@/components/brand/logo";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center bg-stone-100 px-4 py-12">
      <div className="w-full max-w-md">
        <div className="mb-6 flex justify-center">
          <Logo />
        </div>
        <div className="rounded-xl border border-stone-200 bg-white p-8 shadow-sm">{children}</div>
        <p className="mt-6 text-center text-xs text-stone-500">
          Validation, change control and traceable evidence for industrial parts cleaning.
        </p>
      </div>
    </main>
  );
}
