import { IntentLink } from "@/components/ui/intent-link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-6 py-20 text-center">
      <p className="text-sm font-semibold tracking-wide text-stone-500 uppercase">
        404 · Not found
      </p>
      <h1 className="mt-2 text-2xl font-semibold text-stone-900">
        There is no such page or record
      </h1>
      <IntentLink
        href="/"
        className="mt-6 inline-block text-sm font-medium text-brand-700 underline"
      >
        Back to Washproof
      </IntentLink>
    </main>
  );
}
