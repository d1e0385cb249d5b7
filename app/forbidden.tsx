import { IntentLink } from "@/components/ui/intent-link";

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-xl px-6 py-20 text-center">
      <p className="text-sm font-semibold tracking-wide text-stone-500 uppercase">
        403 · Not allowed
      </p>
      <h1 className="mt-2 text-2xl font-semibold text-stone-900">
        Your role does not open this page
      </h1>
      <p className="mt-3 text-sm text-stone-600">
        Access is granted by role. If you need this page for your work, ask an administrator to
        review your roles.
      </p>
      <IntentLink
        href="/"
        className="mt-6 inline-block text-sm font-medium text-brand-700 underline"
      >
        Back to Washproof
      </IntentLink>
    </main>
  );
}
